import { mkdirSync, readFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import { lennardJonesExtxyz } from '../support/fixtures.ts';
import { seedReport } from './helpers/report-data.ts';

const SCREENS = 'test-results/screens';

async function screen(page: Page, name: string): Promise<void> {
  mkdirSync(SCREENS, { recursive: true });
  await page.screenshot({ path: `${SCREENS}/${name}.png`, fullPage: true });
}

test.describe('report page and access links', () => {
  test.use({ viewport: { width: 1280, height: 900 } });

  test('when a report is read, shared by link, and the link revoked, then the holder reads it without signing in and is refused after', async ({ page, context, browser }) => {
    test.setTimeout(300_000);
    const { bytes } = await lennardJonesExtxyz();
    const { reportId, displayName } = await seedReport(context, 'argon-liquid.extxyz', bytes, ['thermo', 'msd', 'vacf', 'vdos', 'rdf', 'sq', 'lindemann', 'ngp']);
    const cards = page.getByRole('list', { name: 'Headline results' });
    const msdCard = cards.getByRole('listitem').filter({ hasText: 'D from MSD (Einstein)' });

    await test.step('the member opens the report and reads D with its error and units, in the unit chosen', async () => {
      await page.goto(`/reports/${reportId}`);
      await expect(page.getByRole('heading', { level: 1, name: /argon-liquid\.extxyz/ })).toBeVisible();
      await expect(page.getByRole('note', { name: 'Caution' })).toContainText('A simulation is a model');
      await expect(msdCard).toContainText(/\d\.\d+ ± \d\.\d+\s*10⁻⁹ m²\/s/);
      await page.getByRole('radiogroup', { name: 'Diffusion coefficient unit' }).getByRole('radio', { name: 'Å²/ps' }).click();
      await expect(msdCard).toContainText(/\d\.\d+ ± \d\.\d+\s*Å²\/ps/);
      await expect(cards.getByRole('listitem').filter({ hasText: 'Mean temperature' })).toContainText(/\d+(\.\d+)? ± \d+(\.\d+)?\s*K/);
      await expect(cards.getByRole('listitem').filter({ hasText: 'Lindemann index' })).toContainText(/solid-like|liquid-like/);
      await expect(page.getByRole('heading', { name: 'Methods' })).toBeVisible();
      await expect(page.getByText(/FFT \(Wiener–Khinchin\)/)).toBeVisible();
      await expect(page.getByRole('region', { name: 'Methods' }).getByText(/SHA-256 [0-9a-f]{64}/)).toBeVisible();
    });

    await test.step('the charts draw, the VDOS axis switches unit, and a curve downloads as CSV with its header', async () => {
      await expect(page.getByRole('img', { name: /MSD against lag time on log–log axes/ })).toBeVisible();
      await expect(page.getByRole('img', { name: /g\(r\) against distance/ })).toBeVisible();
      await page.getByRole('radiogroup', { name: 'VDOS frequency unit' }).getByRole('radio', { name: 'cm⁻¹' }).click();
      await expect(page.getByRole('radiogroup', { name: 'VDOS frequency unit' }).getByRole('radio', { name: 'cm⁻¹' })).toBeChecked();
      const downloading = page.waitForEvent('download');
      await page.getByRole('link', { name: 'Download Mean-square displacement data as CSV' }).click();
      const download = await downloading;
      expect(download.suggestedFilename()).toBe(`ergodic-report-${reportId}-msd.csv`);
      const lines = readFileSync((await download.path())!, 'utf8').trim().split('\n');
      expect(lines[0]).toBe('lag (ps),MSD all (Å²)');
      expect(lines.length).toBeGreaterThan(10);
      expect(lines[2]!.split(',').map(Number).every(Number.isFinite)).toBe(true);
    });

    await test.step('the member comments', async () => {
      await page.getByLabel('Add a comment').fill('Fit window looks sensible for a liquid.');
      await page.getByRole('button', { name: 'Post comment' }).click();
      await expect(page.getByRole('list', { name: 'Comments, oldest first' })).toContainText(displayName);
      await expect(page.getByRole('list', { name: 'Comments, oldest first' })).toContainText('Fit window looks sensible');
      await screen(page, 'report');
    });

    let url = '';
    await test.step('the owner makes an access link from the share dialog', async () => {
      await page.getByRole('button', { name: 'Share' }).click();
      const dialog = page.getByRole('dialog');
      await expect(dialog.getByRole('list', { name: 'Project members' })).toContainText(displayName);
      await dialog.getByLabel('Expires after (days)').fill('3');
      await dialog.getByRole('button', { name: 'Create link' }).click();
      url = await dialog.getByLabel('New access link').inputValue();
      expect(url).toMatch(/\/links\/[\w-]+$/);
      await expect(dialog.getByRole('list', { name: 'Access links' })).toContainText('Active');
      await page.screenshot({ path: `${SCREENS}/report-share-dialog.png` });
    });

    const guestContext = await browser.newContext({ viewport: { width: 1280, height: 900 } });
    try {
      const guest = await guestContext.newPage();
      await test.step('someone without an account opens the link and reads the report, read only', async () => {
        await guest.goto(url);
        await expect(guest.getByRole('note').filter({ hasText: 'Shared with you read only' })).toBeVisible();
        await expect(guest.getByRole('list', { name: 'Headline results' }).getByRole('listitem').filter({ hasText: 'D from MSD (Einstein)' })).toContainText(/10⁻⁹ m²\/s/);
        await expect(guest.getByRole('note', { name: 'Caution' })).toBeVisible();
        await expect(guest.getByRole('img', { name: /MSD against lag time/ })).toBeVisible();
        await expect(guest.getByRole('button', { name: 'Share' })).toHaveCount(0);
        await expect(guest.getByRole('heading', { name: 'Comments' })).toHaveCount(0);
        await expect(guest.getByLabel('Add a comment')).toHaveCount(0);
        expect(await guest.getByRole('link', { name: 'Download Radial distribution function data as CSV' }).getAttribute('href')).toMatch(/^\/api\/links\/.+\/curves\/rdf\.csv$/);
        const csv = await guestContext.request.get(await guest.getByRole('link', { name: 'Download Radial distribution function data as CSV' }).getAttribute('href') ?? '');
        expect(csv.status()).toBe(200);
        expect((await csv.text()).split('\n')[0]).toMatch(/^r \(Å\),g all,N all \(atoms\)/);
        await screen(guest, 'report-link');
      });

      await test.step('the owner revokes the link; the holder is told it no longer works', async () => {
        const dialog = page.getByRole('dialog');
        await dialog.getByRole('button', { name: /^Revoke the link/ }).click();
        await expect(dialog.getByRole('list', { name: 'Access links' })).toContainText('Revoked');
        // The link just made no longer works, so it is no longer offered for copying.
        await expect(dialog.getByLabel('New access link')).toHaveCount(0);
        await expect(dialog.getByRole('button', { name: /Copy link|Copied/ })).toHaveCount(0);
        await guest.reload();
        await expect(guest.getByRole('heading', { name: 'This link has been revoked or has expired' })).toBeVisible();
        await expect(guest.getByRole('list', { name: 'Headline results' })).toHaveCount(0);
        await screen(guest, 'report-link-revoked');
      });
    } finally {
      await guestContext.close();
    }
  });
});
