import { mkdirSync, readFileSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import { randomWalkExtxyz } from '../support/random-walk.ts';
import { completeSignUp, uniqueUser } from './helpers/accounts.ts';
import { canvasPixels } from './helpers/canvas-pixels.ts';

const SCREENS = 'test-results/screens';
const D_A2_PER_PS = 0.5;

async function screen(page: Page, name: string): Promise<void> {
  mkdirSync(SCREENS, { recursive: true });
  await page.screenshot({ path: `${SCREENS}/${name}.png`, fullPage: true });
}

/** Drops a file on an element the way a browser does: a drop event carrying a DataTransfer. */
async function dropFile(page: Page, testId: string, name: string, bytes: Buffer): Promise<void> {
  const transfer = await page.evaluateHandle(({ name, base64 }) => {
    const data = Uint8Array.from(atob(base64), (c) => c.charCodeAt(0));
    const dt = new DataTransfer();
    dt.items.add(new File([data], name, { type: 'text/plain' }));
    return dt;
  }, { name, base64: bytes.toString('base64') });
  const zone = page.getByTestId(testId);
  await zone.dispatchEvent('dragover', { dataTransfer: transfer });
  await zone.dispatchEvent('drop', { dataTransfer: transfer });
}

test('the whole journey: sign up, project, drop a file, analyse, read, download, view frames, share by link and revoke', async ({ page, browser }) => {
  test.setTimeout(420_000);
  const user = uniqueUser('Journey');
  // A walk built with D = 0.5 Å²/ps = 5 × 10⁻⁹ m²/s, so the report's D can be checked against it.
  const file = await randomWalkExtxyz({ atoms: 200, frames: 400, diffusionA2PerPs: D_A2_PER_PS, timeStepPs: 0.1, boxA: 30, seed: 4 });

  await test.step('sign up and create a project', async () => {
    await page.goto('/sign-up');
    await completeSignUp(page, user);
    await expect(page.getByRole('heading', { name: 'Projects', level: 1 })).toBeVisible();
    await page.getByRole('button', { name: /New project/ }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Name').fill('Diffusion check');
    await dialog.getByRole('button', { name: /Create/ }).click();
    await expect(page.getByRole('heading', { name: 'Diffusion check', level: 1 })).toBeVisible();
  });

  await test.step('drop an extended XYZ file and see it inspected to ready', async () => {
    await dropFile(page, 'drop-zone', 'walkers.extxyz', file);
    const upload = page.getByRole('dialog', { name: 'Upload walkers.extxyz' });
    await upload.getByRole('button', { name: 'Upload' }).click();
    await expect(upload).toBeHidden();
    const row = page.getByRole('row').filter({ hasText: 'walkers.extxyz' });
    await expect(row).toContainText(/ready/i, { timeout: 60_000 });
    await expect(row).toContainText('200');
    await expect(row).toContainText('400');
    await screen(page, 'journey-project');
  });

  await test.step('tick MSD, VACF, VDOS and g(r), start, watch the progress, and open the report from the notice', async () => {
    await page.getByRole('button', { name: 'Analyse walkers.extxyz' }).click();
    const dialog = page.getByRole('dialog');
    for (const name of ['Temperature and density']) {
      const box = dialog.getByRole('checkbox', { name });
      if (await box.isChecked()) await box.uncheck();
    }
    for (const name of ['MSD and diffusion', 'Velocity autocorrelation', 'Vibrational density of states', 'Radial distribution g(r)']) {
      await dialog.getByRole('checkbox', { name }).check();
    }
    await dialog.getByRole('button', { name: 'Start analysis' }).click();
    await expect(page.getByRole('list', { name: 'Analysis runs of this project' }).getByRole('listitem').filter({ hasText: 'walkers.extxyz' })).toBeVisible();
    await expect(page.getByText(/The analysis of walkers\.extxyz \(.*\) is done\./)).toBeVisible({ timeout: 180_000 });
    await page.getByRole('button', { name: 'Open report' }).click();
    await expect(page).toHaveURL(/\/reports\/\d+$/);
  });

  let reportUrl = '';
  await test.step('the report shows D within tolerance of the value the walk was built with', async () => {
    reportUrl = page.url();
    const card = page.getByRole('list', { name: 'Headline results' }).getByRole('listitem').filter({ hasText: 'D from MSD (Einstein)' });
    await page.getByRole('radiogroup', { name: 'Diffusion coefficient unit' }).getByRole('radio', { name: 'Å²/ps' }).click();
    await expect(card).toContainText(/Å²\/ps/);
    const text = (await card.textContent()) ?? '';
    const value = Number(/(\d+\.\d+)\s*±/.exec(text)?.[1]);
    // Statistical tolerance for 200 walkers over 400 steps (SCIENCE item 1 gives ≈1 % scatter at 1000 walkers).
    expect(Math.abs(value - D_A2_PER_PS) / D_A2_PER_PS).toBeLessThan(0.1);
    await screen(page, 'journey-report');
  });

  await test.step('download the MSD as CSV and check its header', async () => {
    const downloading = page.waitForEvent('download');
    await page.getByRole('link', { name: 'Download Mean-square displacement data as CSV' }).click();
    const csv = readFileSync((await (await downloading).path())!, 'utf8');
    expect(csv.split('\n')[0]).toBe('lag (ps),MSD all (Å²)');
  });

  await test.step('open the frame viewer and see something drawn', async () => {
    await page.getByRole('link', { name: /Back to the project/ }).click();
    await page.getByRole('link', { name: 'Open walkers.extxyz in the frame viewer' }).click();
    const canvas = page.getByRole('img', { name: /3D view of frame 1 of/ });
    await expect(canvas).toBeVisible({ timeout: 60_000 });
    await expect.poll(async () => (await canvasPixels(page, canvas, [255, 255, 255])).drawn, { timeout: 30_000 }).toBeGreaterThan(500);
    await screen(page, 'journey-viewer');
  });

  let linkUrl = '';
  await test.step('create an access link', async () => {
    await page.goto(reportUrl);
    await page.getByRole('button', { name: 'Share' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Expires after (days)').fill('7');
    await dialog.getByRole('button', { name: 'Create link' }).click();
    linkUrl = await dialog.getByLabel('New access link').inputValue();
    expect(linkUrl).toMatch(/\/links\/[\w-]+$/);
  });

  const guestContext = await browser.newContext();
  try {
    const guest = await guestContext.newPage();
    await test.step('a fresh browser without a session reads the report, read only', async () => {
      await guest.goto(linkUrl);
      await expect(guest.getByRole('list', { name: 'Headline results' })).toContainText('D from MSD (Einstein)');
      await expect(guest.getByRole('button', { name: 'Share' })).toHaveCount(0);
    });
    await test.step('after the link is revoked it is refused', async () => {
      const dialog = page.getByRole('dialog');
      await dialog.getByRole('button', { name: /Revoke/ }).first().click();
      await expect(dialog.getByRole('list', { name: 'Access links' })).toContainText('Revoked');
      await guest.reload();
      await expect(guest.getByText(/revoked or has expired/)).toBeVisible();
    });
  } finally {
    await guestContext.close();
  }
});
