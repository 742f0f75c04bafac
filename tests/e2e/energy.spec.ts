import { expect, test } from '@playwright/test';
import { lennardJonesExtxyz } from '../support/fixtures.ts';
import { captureAtBothSizes } from './helpers/screens.ts';
import { argonLikeModel, seedProjectWithModel } from './helpers/seed-energy.ts';

test('when a trajectory with a Lennard-Jones model is analysed for energy, then the report shows energy, drift, pressure and heat-capacity cards and charts', async ({ page, context }) => {
  test.setTimeout(300_000);
  const { bytes } = await lennardJonesExtxyz();
  const seeded = await seedProjectWithModel(context, 'larkspur-argon-nve-86K.extxyz', bytes, ['thermo', 'energy'], argonLikeModel(), 'NVE');

  await page.goto(`/reports/${seeded.reportId}`);
  await expect(page.getByRole('heading', { level: 1, name: /larkspur-argon-nve-86K\.extxyz/ })).toBeVisible();
  const cards = page.getByRole('list', { name: 'Headline results' }).getByRole('listitem');

  await test.step('the cards: potential energy, virial pressure, drift with its NVE check, C_V from fluctuations', async () => {
    // A bound Lennard-Jones liquid has a negative potential energy per atom (the well depth is the only attraction).
    await expect(cards.filter({ hasText: 'Potential energy' })).toContainText(/[-−]0\.0\d+ ± [\d.]+\s*eV per atom/);
    await expect(cards.filter({ hasText: 'Potential energy' })).toContainText('from the interaction model');
    await expect(cards.filter({ hasText: 'Virial pressure' })).toContainText(/bar/);
    await expect(cards.filter({ hasText: 'Total-energy drift' })).toContainText(/eV per atom per ns/);
    await expect(cards.filter({ hasText: 'Total-energy drift' })).toContainText('NVE check');
    await expect(cards.filter({ hasText: /C_V from energy fluctuations at \d+(\.\d+)? K/ })).toContainText(/k_B per atom/);
  });

  await test.step('the charts: energies, total energy with its drift line, pressure', async () => {
    await expect(page.getByRole('img', { name: /Potential energy per atom/ })).toBeVisible();
    await expect(page.getByRole('img', { name: /Total energy per atom/ })).toBeVisible();
    await expect(page.getByRole('img', { name: /Pressure against time/ })).toBeVisible();
    await expect(page.getByRole('link', { name: 'Download Pressure data as CSV' })).toBeVisible();
  });

  await test.step('at a desktop and a phone, nothing is wider than the window', async () => {
    await captureAtBothSizes(page, 'report-energy');
  });
});
