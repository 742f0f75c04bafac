import { mkdirSync } from 'node:fs';
import { expect, test, type ConsoleMessage, type Page } from '@playwright/test';
import { randomWalkExtxyz } from '../support/random-walk.ts';
import { completeSignUp, uniqueUser } from './helpers/accounts.ts';
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

/** Console errors and uncaught exceptions of a page, as a reader of its console would see them. */
function watchConsole(page: Page): { errors: string[]; uncaught: string[] } {
  const seen = { errors: [] as string[], uncaught: [] as string[] };
  page.on('console', (m: ConsoleMessage) => {
    if (m.type() === 'error') seen.errors.push(`${m.text()} (${m.location().url})`);
  });
  page.on('pageerror', (e) => seen.uncaught.push(e.message));
  return seen;
}

async function xsrf(page: Page): Promise<Record<string, string>> {
  return { 'X-XSRF-TOKEN': decodeURIComponent((await page.context().cookies()).find((c) => c.name === 'XSRF-TOKEN')!.value) };
}

test.describe('audit log, cut names and a quiet console', () => {
  test.use({ viewport: { width: 1440, height: 900 } });

  test('when a signed-out visitor opens the app, then nothing is logged as an error', async ({ page }) => {
    const seen = watchConsole(page);
    await page.goto('/');
    await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
    await page.goto('/projects');
    await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
    expect(seen.errors).toEqual([]);
    expect(seen.uncaught).toEqual([]);
  });

  test('when a report belongs to someone else, then the page says "Report not found." and nothing is thrown', async ({ page, browser }) => {
    const ownerContext = await browser.newContext();
    let reportId = 0;
    try {
      ({ reportId } = await seedReport(ownerContext, 'larkspur-private.extxyz',
        await randomWalkExtxyz({ atoms: 12, frames: 30, diffusionA2PerPs: 0.5, timeStepPs: 0.1, boxA: 15, seed: 5 }), ['msd']));
    } finally {
      await ownerContext.close();
    }
    const stranger = uniqueUser('Stranger');
    await page.goto('/sign-up');
    await completeSignUp(page, stranger);
    await expect(page.getByRole('button', { name: `Account menu for ${stranger.name}` })).toBeVisible();
    const seen = watchConsole(page);
    await page.goto(`/reports/${reportId}`);
    await expect(page.getByRole('alert')).toContainText('Report not found.');
    await expect(page.getByRole('link', { name: 'Your projects' })).toBeVisible();
    await expect(page.getByRole('button', { name: 'Try again' })).toHaveCount(0);
    await screens(page, 'report-not-found');
    expect(seen.uncaught).toEqual([]);
    // The browser itself notes the refused request; nothing else may reach the console.
    expect(seen.errors.filter((e) => !e.includes(`/api/reports/${reportId}`))).toEqual([]);
  });

  test('when an owner changes the project, then the audit log shows it at once and names reports by title; a cut is named from frame 1', async ({ page, context }) => {
    const bytes = await randomWalkExtxyz({ atoms: 12, frames: 30, diffusionA2PerPs: 0.5, timeStepPs: 0.1, boxA: 15, seed: 8 });
    const { reportId, projectId } = await seedReport(context, 'larkspur-audit.extxyz', bytes, ['msd']);
    const title = ((await (await context.request.get(`/api/reports/${reportId}`)).json()) as { report: { title: string } }).report.title;
    const link = await context.request.post(`/api/reports/${reportId}/access-link`, { data: { expiresInDays: 3 }, headers: await xsrf(page) });
    expect(link.status(), await link.text()).toBe(201);

    await page.goto(`/projects/${projectId}/settings`);
    const log = page.getByRole('list', { name: 'Audit log' });
    await expect(log).toContainText(`made an access link to the report “${title}”`);
    await expect(log).not.toContainText('#');

    await page.getByLabel('E-mail to invite').fill('hollis.reed@larkspur-lab.example');
    await page.getByRole('button', { name: 'Send invitation' }).click();
    await expect(log).toContainText('invited hollis.reed@larkspur-lab.example as');
    await screens(page, 'audit-log');

    await page.goto(`/projects/${projectId}`);
    await page.getByRole('button', { name: 'More actions for larkspur-audit.extxyz' }).first().click();
    await page.getByRole('menuitem', { name: 'Download a cut' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByRole('spinbutton', { name: 'First frame' }).fill('1');
    await dialog.getByRole('spinbutton', { name: 'Last frame' }).fill('10');
    const downloading = page.waitForEvent('download');
    await dialog.getByRole('link', { name: 'Download' }).click();
    expect((await downloading).suggestedFilename()).toBe('larkspur-audit-frames-1-10.extxyz');
  });
});
