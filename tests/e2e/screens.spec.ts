import { mkdirSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import { randomWalkExtxyz } from '../support/random-walk.ts';
import { chooseAndUpload } from './helpers/upload.ts';
import { readyTrajectory } from './helpers/viewer-data.ts';

/**
 * Every main screen at a desktop and a phone size: a screenshot for people to
 * look at, and a check that nothing is wider than the window.
 */
const SCREENS = 'test-results/screens';
const SIZES = [{ name: 'desktop', width: 1440, height: 900 }, { name: 'phone', width: 390, height: 844 }] as const;

async function capture(page: Page, name: string): Promise<void> {
  mkdirSync(SCREENS, { recursive: true });
  for (const size of SIZES) {
    await page.setViewportSize({ width: size.width, height: size.height });
    const overflow = await page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
    await page.screenshot({ path: `${SCREENS}/${name}-${size.name}.png`, fullPage: true });
    expect(overflow, `${name} at ${size.width} px is ${overflow} px wider than the window`).toBeLessThanOrEqual(0);
  }
}

test.describe('screens at 1440 and 390 px', () => {
  test('project page with uploads and runs', async ({ page, context }) => {
    const trajectory = await readyTrajectory(context, 'argon-liquid-production-run-300K.extxyz',
      await randomWalkExtxyz({ atoms: 30, frames: 60, diffusionA2PerPs: 0.5, timeStepPs: 0.1, boxA: 20, seed: 3 }));
    await page.goto(`/projects/${trajectory.projectId}`);
    await page.getByRole('button', { name: /^Analyse / }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Start analysis' }).click();
    await chooseAndUpload(page, [{ name: 'tiny.xyz', buffer: Buffer.from('1\nx\nAr 0 0 0\n') }]);
    await expect(page.getByRole('list', { name: 'Analysis runs of this project' }).getByRole('link', { name: 'Open report' })).toBeVisible({ timeout: 120_000 });
    await expect(page.getByRole('list', { name: 'Uploads' })).toContainText(/Ready|Inspection failed/, { timeout: 60_000 });
    await capture(page, 'project');
  });
});
