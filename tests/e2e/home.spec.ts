import { expect, test } from '@playwright/test';

test('when a visitor opens the home page, then Ergodic loads and no request leaves 127.0.0.1', async ({ page, baseURL }) => {
  const outside: string[] = [];
  page.on('request', (request) => {
    const url = new URL(request.url());
    if (!['http:', 'https:', 'ws:', 'wss:'].includes(url.protocol)) return;
    if (url.hostname !== '127.0.0.1') outside.push(request.url());
  });

  await page.goto('/');

  await expect(page).toHaveTitle(/Ergodic/);
  await expect(page.getByRole('link', { name: 'Ergodic home' })).toBeVisible();
  // Visitors land on sign-in: every project page needs an account.
  await expect(page.getByRole('heading', { name: 'Sign in', level: 1 })).toBeVisible();
  // The shipped icon font and Noto Sans must load from our own origin.
  await page.evaluate(() => document.fonts.ready);
  const fonts = await page.evaluate(() => [...document.fonts].filter((f) => f.status === 'loaded').map((f) => f.family));
  expect(fonts.join(',')).toMatch(/Noto Sans/);
  expect(new URL(baseURL!).hostname).toBe('127.0.0.1');
  expect(outside).toEqual([]);
});
