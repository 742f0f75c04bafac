import { mkdirSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import { writeExtxyz } from '../../server/formats/write-extxyz.ts';
import { simulateLennardJones } from '../../server/simulate/lennard-jones.ts';
import { trajectoryToFrames } from '../../server/simulate/to-frames.ts';
import { seedReport } from './helpers/report-data.ts';

const SCREENS = 'test-results/screens';

async function screens(page: Page, name: string): Promise<void> {
  mkdirSync(SCREENS, { recursive: true });
  for (const [label, width, height] of [['1440', 1440, 900], ['390', 390, 844]] as const) {
    await page.setViewportSize({ width, height });
    await page.screenshot({ path: `${SCREENS}/${name}-${label}.png`, fullPage: true });
  }
  await page.setViewportSize({ width: 1440, height: 900 });
}

/** A Lennard-Jones liquid with every other atom labelled Kr: two species for the per-species cards. */
async function twoSpeciesLiquid(): Promise<Buffer> {
  const run = simulateLennardJones({
    cellsPerSide: 3, reducedDensity: 0.8442, temperatureK: 86.5, meltTemperatureK: 250, meltSteps: 200,
    equilibrationSteps: 400, productionSteps: 1200, sampleEvery: 10, seed: 11,
  });
  run.trajectory.species = run.trajectory.species.map((s, i) => (i % 2 ? 'Kr' : s));
  const chunks: Uint8Array[] = [];
  for await (const chunk of writeExtxyz(trajectoryToFrames(run.trajectory))) chunks.push(chunk);
  return Buffer.concat(chunks);
}

test.describe('headline cards', () => {
  test.use({ viewport: { width: 1440, height: 900 } });

  test('when a two-species run is read, then entropy, zero-point energy, the S(q) and α₂ peaks, and D and coordination per species have cards', async ({ page, context }) => {
    test.setTimeout(300_000);
    const { reportId } = await seedReport(context, 'larkspur-ar-kr-liquid.extxyz', await twoSpeciesLiquid(), ['thermo', 'msd', 'vacf', 'vdos', 'rdf', 'sq', 'ngp']);
    await page.goto(`/reports/${reportId}`);
    const cards = page.getByRole('list', { name: 'Headline results' });
    const card = (title: string | RegExp) => cards.getByRole('listitem').filter({ has: page.getByRole('heading', { name: title }) });

    await expect(card(/^Heat capacity Cv at \d+(\.\d+)? K$/)).toContainText(/the kinetic temperature/);
    await expect(card(/^Vibrational entropy at \d+(\.\d+)? K$/)).toContainText(/\d\.\d+ ± \d\.\d+\s*k_B per atom/);
    await expect(card('Zero-point energy')).toContainText(/\d\.\d+ ± \d\.\d+\s*meV per atom/);
    await expect(card('Zero-point energy')).toContainText(/kJ\/mol/);
    await expect(card('First peak of S(q)')).toContainText(/\d(\.\d+)?\s*Å⁻¹/);
    for (const title of ['D by species (MSD)', 'D by species (VACF)', 'Peak of α₂ by species']) {
      const rows = card(title).getByRole('term');
      await expect(rows).toHaveText(['Ar', 'Kr']);
    }
    await expect(card('D by species (MSD)')).toContainText(/in 10⁻⁹ m²\/s/);
    await expect(card('Coordination by species pair').getByRole('term')).toHaveText(['Ar-Ar', 'Ar-Kr', 'Kr-Kr']);
    await screens(page, 'report-cards');

    // Adjusting this run keeps "Temperature for Cv" empty, as its hint says: the kinetic temperature is used.
    await page.getByRole('button', { name: 'Adjust and run' }).click();
    const dialog = page.getByRole('dialog');
    await expect(dialog.getByRole('spinbutton', { name: 'Temperature for Cv (K)' })).toHaveValue('');
    await expect(dialog.getByText(/^Empty: the kinetic temperature/)).toBeVisible();
  });
});
