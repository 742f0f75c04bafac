import { expect, test } from '@playwright/test';
import { randomWalkExtxyz } from '../support/random-walk.ts';
import { chooseAndUpload } from './helpers/upload.ts';
import { readyTrajectory } from './helpers/viewer-data.ts';

/** Plain XYZ states no times: without metadata the server refuses time-based analyses (409). */
function untimedXyz(frames: number): Buffer {
  const blocks = Array.from({ length: frames }, (_, f) => `2\nframe ${f}\nAr 0 0 ${f * 0.1}\nAr 1 1 ${1 + f * 0.1}\n`);
  return Buffer.from(blocks.join(''));
}

test.describe('metadata', () => {
  test('when files are described at upload, then the first inspection already has their time step and temperature', async ({ page, context }) => {
    const first = await readyTrajectory(context, 'first.extxyz', await randomWalkExtxyz({ atoms: 4, frames: 5, diffusionA2PerPs: 0.5, timeStepPs: 0.1, boxA: 10, seed: 5 }));
    await page.goto(`/projects/${first.projectId}`);
    await chooseAndUpload(page, [{ name: 'described.xyz', buffer: untimedXyz(6) }], async (dialog) => {
      await expect(dialog.getByRole('list', { name: 'Files to upload' })).toContainText('described.xyz');
      await dialog.getByLabel('Time between frames').fill('2');
      await dialog.getByRole('combobox', { name: 'Time unit' }).click();
      await page.getByRole('option', { name: 'fs' }).click();
      await dialog.getByLabel('Temperature (K)').fill('90');
    });
    const row = page.getByRole('row').filter({ hasText: 'described.xyz' });
    await expect(row).toContainText(/ready/i, { timeout: 60_000 });
    await expect(row).toContainText('90');
    await page.getByRole('button', { name: 'Analyse described.xyz' }).click();
    const dialog = page.getByRole('dialog');
    await expect(dialog).toContainText('2 fs between frames');
    await expect(dialog.getByRole('button', { name: 'Start analysis' })).toBeEnabled();
  });

  test('when a file states no time step, then Start is disabled and the warning leads to the metadata form', async ({ page, context }) => {
    const first = await readyTrajectory(context, 'first.extxyz', await randomWalkExtxyz({ atoms: 4, frames: 5, diffusionA2PerPs: 0.5, timeStepPs: 0.1, boxA: 10, seed: 6 }));
    await page.goto(`/projects/${first.projectId}`);
    await chooseAndUpload(page, [{ name: 'untimed.xyz', buffer: untimedXyz(6) }]);
    await expect(page.getByRole('row').filter({ hasText: 'untimed.xyz' })).toContainText(/ready/i, { timeout: 60_000 });

    await page.getByRole('button', { name: 'Analyse untimed.xyz' }).click();
    const analyse = page.getByRole('dialog', { name: 'Analyse untimed.xyz' });
    await expect(analyse.getByRole('alert').filter({ hasText: 'time between frames is not known' })).toBeVisible();
    await expect(analyse.getByRole('button', { name: 'Start analysis' })).toBeDisabled();
    await analyse.getByRole('button', { name: 'Set it in the metadata' }).click();

    const metadata = page.getByRole('dialog', { name: 'Metadata of untimed.xyz' });
    await metadata.getByLabel('Time between frames').fill('0.5');
    await metadata.getByRole('button', { name: 'Save' }).click();
    await expect(metadata).toBeHidden();
    await page.getByRole('button', { name: 'Analyse untimed.xyz' }).click();
    const again = page.getByRole('dialog', { name: 'Analyse untimed.xyz' });
    await expect(again).toContainText('0.5 ps between frames');
    await expect(again.getByRole('alert').filter({ hasText: 'time between frames is not known' })).toHaveCount(0);
    await expect(again.getByRole('button', { name: 'Start analysis' })).toBeEnabled();
  });

  test('when several trajectories are selected, then one change applies to all of them and to no other', async ({ page, context }) => {
    const first = await readyTrajectory(context, 'kept.extxyz', await randomWalkExtxyz({ atoms: 4, frames: 5, diffusionA2PerPs: 0.5, timeStepPs: 0.1, boxA: 10, seed: 7 }));
    await page.goto(`/projects/${first.projectId}`);
    await chooseAndUpload(page, [{ name: 'melt-a.xyz', buffer: untimedXyz(4) }, { name: 'melt-b.xyz', buffer: untimedXyz(5) }]);
    for (const name of ['melt-a.xyz', 'melt-b.xyz']) await expect(page.getByRole('row').filter({ hasText: name })).toContainText(/ready/i, { timeout: 60_000 });

    await page.getByRole('checkbox', { name: 'Select melt-a.xyz' }).check();
    await page.getByRole('checkbox', { name: 'Select melt-b.xyz' }).check();
    await page.getByRole('button', { name: 'Edit metadata of 2' }).click();
    const dialog = page.getByRole('dialog', { name: 'Metadata of 2 trajectories' });
    await dialog.getByRole('combobox', { name: 'Ensemble' }).click();
    await page.getByRole('option', { name: 'NVT' }).click();
    await dialog.getByRole('button', { name: 'Apply to 2' }).click();
    await expect(dialog).toBeHidden();

    for (const name of ['melt-a.xyz', 'melt-b.xyz']) await expect(page.getByRole('row').filter({ hasText: name })).toContainText('NVT');
    await expect(page.getByRole('row').filter({ hasText: 'kept.extxyz' })).not.toContainText('NVT');
  });
});

/** Atom names as biomolecular files write them: CA an α-carbon, NE a nitrogen, and a bead that names no element. */
function atomNamesXyz(): Buffer {
  const blocks = Array.from({ length: 4 }, (_, f) => `4\nLattice="20 0 0 0 20 0 0 0 20" Properties=species:S:1:pos:R:3 Time=${f * 0.1}\nCA 1 1 ${1 + f * 0.1}\nNE 3 3 3\nbead 5 5 5\nO 7 7 7\n`);
  return Buffer.from(blocks.join(''));
}

const SIZES = [{ name: 'desktop', width: 1440, height: 900 }, { name: 'phone', width: 390, height: 844 }] as const;

test.describe('species and elements', () => {
  test('when a file labels atoms CA, NE and bead, then the table lists what was assumed, and the metadata form confirms CA as carbon and gives the bead its mass', async ({ page, context }) => {
    const trajectory = await readyTrajectory(context, 'names.extxyz', atomNamesXyz());
    await page.goto(`/projects/${trajectory.projectId}`);
    const row = page.getByRole('row').filter({ hasText: 'names.extxyz' });
    await expect(row).toContainText('To confirm: CA taken as C, NE as N; no element for bead');

    await page.getByRole('button', { name: 'More actions for names.extxyz' }).click();
    await page.getByRole('menuitem', { name: 'Edit metadata' }).click();
    const dialog = page.getByRole('dialog', { name: 'Metadata of names.extxyz' });
    await expect(dialog.getByLabel('Element of CA')).toHaveValue('C');
    await expect(dialog.getByLabel('Mass of CA (u)')).toHaveValue('12.011');
    await expect(dialog.locator('[data-species="O"]')).toContainText('symbol in the file');
    await expect(dialog.locator('[data-species="bead"]')).toContainText('unknown: give a mass');

    for (const size of SIZES) {
      await page.setViewportSize({ width: size.width, height: size.height });
      await dialog.locator('[data-species="bead"]').scrollIntoViewIfNeeded();
      await page.screenshot({ path: `test-results/screens/species-elements-${size.name}.png` });
    }
    await page.setViewportSize({ width: 1440, height: 900 });

    // A symbol in the wrong case is refused in place, with the right spelling offered.
    await dialog.getByLabel('Element of NE').fill('NE');
    await expect(dialog.locator('[data-species="NE"]')).toContainText('Write it as "Ne": case tells elements apart');
    await dialog.getByLabel('Element of NE').fill('N');
    await dialog.locator('[data-species="CA"]').getByRole('checkbox', { name: 'Confirmed' }).check();
    await dialog.getByLabel('Mass of bead (u)').fill('72');
    await dialog.getByRole('button', { name: 'Save' }).click();
    await expect(dialog).toBeHidden();
    await expect(row).not.toContainText('To confirm');

    const stored = await (await context.request.get(`/api/trajectories/${trajectory.id}`)).json();
    expect(stored.trajectory.speciesElements).toEqual({
      CA: { element: 'C', massU: 12.011, status: 'confirmed' },
      NE: { element: 'N', massU: 14.007, status: 'confirmed' },
      bead: { element: null, massU: 72, status: 'confirmed' },
      O: { element: 'O', massU: 15.999, status: 'exact' },
    });
  });
});
