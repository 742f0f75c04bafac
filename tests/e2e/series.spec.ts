import { mkdirSync, readFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import { lennardJonesExtxyz } from '../support/fixtures.ts';
import { projectWithRuns, type RunFile } from './helpers/series-data.ts';

const SCREENS = 'test-results/screens';

async function screen(page: Page, name: string): Promise<void> {
  mkdirSync(SCREENS, { recursive: true });
  await page.screenshot({ path: `${SCREENS}/${name}.png`, fullPage: true });
}

/**
 * Three argon-like runs of the repo's own LJ integrator (σ = 3.405 Å, ε/k_B = 119.8 K):
 * an FCC crystal at 40 K never melted, a liquid near the triple point at 90 K
 * and a hotter, less dense liquid at 130 K (LJ triple point T* ≈ 0.69, i.e.
 * about 83 K for these parameters: SCIENCE item 31, FROM MEMORY).
 */
async function argonRuns(): Promise<RunFile[]> {
  // 108 atoms: the cut-off is shortened to 2.2σ so it stays inside half the densest box.
  const common = { cellsPerSide: 3, cutoffSigma: 2.2, equilibrationSteps: 400, productionSteps: 1500, sampleEvery: 10 };
  const solid = await lennardJonesExtxyz({ ...common, temperatureK: 40, reducedDensity: 1.05, meltSteps: 0, meltTemperatureK: undefined, seed: 31 });
  const liquid = await lennardJonesExtxyz({ ...common, temperatureK: 90, reducedDensity: 0.8442, seed: 32 });
  const hot = await lennardJonesExtxyz({ ...common, temperatureK: 130, reducedDensity: 0.75, seed: 33 });
  return [
    { name: 'argon-040K.extxyz', bytes: solid.bytes, temperatureK: 40 },
    { name: 'argon-090K.extxyz', bytes: liquid.bytes, temperatureK: 90 },
    { name: 'argon-130K.extxyz', bytes: hot.bytes, temperatureK: 130 },
  ];
}

test.describe('state-point series', () => {
  test.use({ viewport: { width: 1440, height: 900 } });

  test('when three runs are ticked and compared, then the series names each phase with its evidence, fits E_a, brackets melting, and opens signed out by link', async ({ page, context, browser }) => {
    test.setTimeout(600_000);
    const runs = await argonRuns();
    const { projectId } = await projectWithRuns(context, runs);

    await test.step('tick the three runs in the project table and compare them', async () => {
      await page.goto(`/projects/${projectId}`);
      for (const run of runs) await page.getByRole('checkbox', { name: `Select ${run.name}` }).check();
      await page.getByRole('button', { name: 'Compare 3 as a series' }).click();
      const dialog = page.getByRole('dialog', { name: /Compare 3 trajectories/ });
      await expect(dialog.getByRole('list', { name: 'Members, in the order of the series' })).toContainText('argon-040K.extxyz');
      await dialog.getByLabel('Series name').fill('Argon heating study');
      await dialog.getByRole('button', { name: 'Create series' }).click();
      await expect(page).toHaveURL(/\/series\/\d+$/);
      await expect(page.getByRole('heading', { level: 1, name: 'Argon heating study' })).toBeVisible();
    });

    const members = page.getByRole('table', { name: 'Members' });
    // A member's main row is named from its cells: its order, then its file name (evidence rows start with words).
    const row = (name: string) => members.getByRole('row', { name: new RegExp(`^\\d+ ${name.replace(/\./g, '\\.')} `) });

    await test.step('the members are analysed and the series becomes ready', async () => {
      await expect(page.getByText('Ready', { exact: true })).toBeVisible({ timeout: 480_000 });
      await expect(row('argon-040K.extxyz')).toContainText('Analysed');
    });

    await test.step('each member has its stated and measured temperature and a phase with the evidence beside it', async () => {
      // Columns: order, trajectory, stated T, measured T, …
      await expect(row('argon-040K.extxyz').getByRole('cell').nth(2)).toHaveText('40');
      await expect(row('argon-040K.extxyz').getByRole('cell').nth(3)).toHaveText(/^\s*\d+(\.\d+)? ± \d+(\.\d+)?\s*$/);
      await expect(row('argon-040K.extxyz').getByText('solid', { exact: true })).toBeVisible();
      await expect(row('argon-130K.extxyz').getByText('liquid', { exact: true })).toBeVisible();
      await expect(members.getByRole('list', { name: 'Evidence for solid' })).toContainText('Lindemann ratio');
      await expect(members.getByRole('list', { name: 'Evidence for liquid' }).first()).toContainText('Diffusion');
    });

    await test.step('the Arrhenius fit gives E_a with its error in kJ/mol and eV, and melting is bracketed with its caution', async () => {
      await expect(page.getByLabel('Activation energy', { exact: true })).toHaveText(/E\s*a = \d+(\.\d+)? ± \d+(\.\d+)? kJ\/mol = \d+(\.\d+)? ± \d+(\.\d+)? eV/);
      const melting = page.getByRole('region', { name: 'Melting bracket' });
      await expect(page.getByLabel('Melting bracket, Whole series')).toHaveText(/\d+(\.\d+)? K < T < \d+(\.\d+)? K/);
      await expect(melting).toContainText('argon-040K.extxyz is solid; argon-090K.extxyz is liquid.');
      await expect(melting).toContainText(/overshoots the melting point/);
    });

    await test.step('the charts draw, coloured by temperature, and a chart downloads as CSV with units in its header', async () => {
      await expect(page.getByRole('img', { name: /Mean-square displacement against lag time on log–log axes, one line per member/ })).toBeVisible();
      await expect(page.getByRole('img', { name: /weighted Arrhenius fit/ })).toBeVisible();
      const downloading = page.waitForEvent('download');
      await page.getByRole('button', { name: 'Download Diffusion coefficient D(T) data as CSV' }).click();
      const download = await downloading;
      expect(download.suggestedFilename()).toMatch(/^ergodic-series-\d+-diffusion\.csv$/);
      const lines = readFileSync((await download.path())!, 'utf8').trim().split('\n');
      expect(lines[0]).toBe('member,T (K),D (10⁻⁹ m²/s),D std error (10⁻⁹ m²/s),phase,excluded from fits');
      expect(lines.length).toBeGreaterThanOrEqual(3);
      await screen(page, 'series-1440');
    });

    await test.step('on a phone the members become cards and still show their phase', async () => {
      await page.setViewportSize({ width: 390, height: 844 });
      await expect(page.getByRole('list', { name: 'Members' }).getByRole('listitem', { name: 'argon-040K.extxyz' })).toContainText('solid');
      await screen(page, 'series-390');
      await page.setViewportSize({ width: 1440, height: 900 });
    });

    let linkUrl = '';
    await test.step('an access link is made from the share dialog', async () => {
      await page.getByRole('button', { name: 'Share' }).click();
      const dialog = page.getByRole('dialog');
      await expect(dialog).toContainText('Anyone with a link can read this series');
      await dialog.getByLabel('Expires after (days)').fill('3');
      await dialog.getByRole('button', { name: 'Create link' }).click();
      linkUrl = await dialog.getByLabel('New access link').inputValue();
      expect(linkUrl).toMatch(/\/links\/[\w-]+$/);
      await dialog.getByRole('button', { name: 'Done' }).click();
    });

    const guestContext = await browser.newContext({ viewport: { width: 1440, height: 900 } });
    try {
      const guest = await guestContext.newPage();
      await test.step('a fresh browser without a session reads the series, read only', async () => {
        await guest.goto(linkUrl);
        await expect(guest.getByRole('heading', { level: 1, name: 'Argon heating study' })).toBeVisible();
        await expect(guest.getByRole('note').filter({ hasText: 'read only through an access link' })).toBeVisible();
        await expect(guest.getByRole('table', { name: 'Members' }).getByRole('row', { name: /^1 argon-040K\.extxyz / }).getByText('solid', { exact: true })).toBeVisible();
        await expect(guest.getByLabel('Activation energy', { exact: true })).toContainText('kJ/mol');
        await expect(guest.getByRole('img', { name: /g\(r\) against distance|Radial distribution function against distance/ })).toBeVisible();
        await expect(guest.getByRole('button', { name: 'Share' })).toHaveCount(0);
        await expect(guest.getByRole('button', { name: 'Add members' })).toHaveCount(0);
        await expect(guest.getByLabel('Add a comment')).toHaveCount(0);
        await screen(guest, 'series-link');
      });
    } finally {
      await guestContext.close();
    }
  });
});
