import { mkdirSync } from 'node:fs';
import { expect, type Locator, type Page } from '@playwright/test';

/** Screenshots land here for people to look at; each name is taken at both sizes. */
export const SCREENS_DIR = 'test-results/screens';
export const SIZES = [{ name: 'desktop', width: 1440, height: 900 }, { name: 'phone', width: 390, height: 844 }] as const;

/** How many CSS pixels the page, or the given element, is wider than the space it has. */
export async function overflowOf(page: Page, within?: Locator): Promise<number> {
  if (within) return within.evaluate((el) => el.scrollWidth - el.clientWidth);
  return page.evaluate(() => document.documentElement.scrollWidth - document.documentElement.clientWidth);
}

/**
 * Screenshots the page at 1440×900 and 390×844 and fails when anything is
 * wider than the window (or, for a dialog, wider than the dialog), naming the
 * screen and the size. `ready` waits for the state to settle after a resize.
 */
export async function captureAtBothSizes(page: Page, name: string, options: { within?: Locator; ready?: () => Promise<void> } = {}): Promise<void> {
  mkdirSync(SCREENS_DIR, { recursive: true });
  for (const size of SIZES) {
    await page.setViewportSize({ width: size.width, height: size.height });
    if (options.ready) await options.ready();
    // Soft, so every size still gets its screenshot; the test fails at its end.
    await expect.configure({ soft: true }).poll(() => overflowOf(page, options.within), { message: `${name} at ${size.width} px is wider than its space`, timeout: 5_000 }).toBeLessThanOrEqual(0);
    await page.screenshot({ path: `${SCREENS_DIR}/${name}-${size.name}.png`, fullPage: !options.within });
  }
  await page.setViewportSize({ width: SIZES[0].width, height: SIZES[0].height });
}
