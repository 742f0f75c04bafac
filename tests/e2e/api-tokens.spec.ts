import { expect, test } from '@playwright/test';
import { completeSignUp, uniqueUser } from './helpers/accounts.ts';

test('when a user creates an API token, then it is shown once, works as Bearer, and stops working once revoked', async ({ page, request }) => {
  const user = uniqueUser('Scripter');
  await page.goto('/sign-up');
  await completeSignUp(page, user);
  await page.getByRole('button', { name: `Account menu for ${user.name}` }).click();
  await page.getByRole('menuitem', { name: 'API tokens' }).click();
  await expect(page.getByRole('heading', { name: 'API tokens', level: 1 })).toBeVisible();
  await expect(page.getByText('No tokens yet.')).toBeVisible();

  await page.getByLabel('Token name').fill('cluster upload script');
  await page.getByRole('button', { name: 'Create token' }).click();
  const secret = page.getByLabel('New API token');
  await expect(secret).toHaveText(/^erg_[A-Za-z0-9_-]{43}$/);
  const token = (await secret.textContent())!.trim();
  await expect(page.getByRole('button', { name: 'Copy' })).toBeVisible();
  await expect(page.getByRole('table', { name: 'Your API tokens' })).toContainText('cluster upload script');

  const asScript = await request.get('/api/auth/me', { headers: { Authorization: `Bearer ${token}` } });
  expect(asScript.status()).toBe(200);
  expect((await asScript.json()).user.email).toBe(user.email);

  await page.getByRole('button', { name: 'Revoke token cluster upload script' }).click();
  await expect(page.getByText('No tokens yet.')).toBeVisible();
  await expect(page.getByLabel('New API token')).toHaveCount(0);
  const revoked = await request.get('/api/auth/me', { headers: { Authorization: `Bearer ${token}` } });
  expect(revoked.status()).toBe(401);
});
