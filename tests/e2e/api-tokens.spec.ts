import { expect, test } from '@playwright/test';
import { completeSignUp, uniqueUser } from './helpers/accounts.ts';

test('when a user creates an API token, then it is shown once with its expiry, works as Bearer, and stops working once revoked, staying listed as revoked', async ({ page, request }) => {
  const user = uniqueUser('Scripter');
  await page.goto('/sign-up');
  await completeSignUp(page, user);
  await page.getByRole('button', { name: `Account menu for ${user.name}` }).click();
  await page.getByRole('menuitem', { name: 'API tokens' }).click();
  await expect(page.getByRole('heading', { name: 'API tokens', level: 1 })).toBeVisible();
  await expect(page.getByText('No tokens yet.')).toBeVisible();

  await page.getByLabel('Token name').fill('cluster upload script');
  await page.getByRole('combobox', { name: 'Expires' }).click();
  await page.getByRole('option', { name: 'In 30 days' }).click();
  await page.getByRole('button', { name: 'Create token' }).click();
  const secret = page.getByLabel('New API token');
  await expect(secret).toHaveText(/^erg_[A-Za-z0-9_-]{43}$/);
  const token = (await secret.textContent())!.trim();
  await expect(page.getByRole('button', { name: 'Copy' })).toBeVisible();
  const table = page.getByRole('table', { name: 'Your API tokens' });
  await expect(table).toContainText('cluster upload script');
  await expect(table).toContainText('Active');
  const in30Days = new Date(Date.now() + 30 * 86_400_000);
  await expect(table).toContainText(String(in30Days.getFullYear()));

  const asScript = await request.get('/api/auth/me', { headers: { Authorization: `Bearer ${token}` } });
  expect(asScript.status()).toBe(200);
  expect((await asScript.json()).user.email).toBe(user.email);

  await page.getByRole('button', { name: 'Revoke token cluster upload script' }).click();
  await page.getByRole('dialog', { name: 'Revoke token “cluster upload script”?' }).getByRole('button', { name: 'Revoke token' }).click();
  // Stopped tokens stay listed for a while, saying why, without a revoke button.
  await expect(table.getByRole('row', { name: /cluster upload script/ })).toContainText('Revoked');
  await expect(page.getByRole('button', { name: 'Revoke token cluster upload script' })).toHaveCount(0);
  await expect(page.getByLabel('New API token')).toHaveCount(0);
  const revoked = await request.get('/api/auth/me', { headers: { Authorization: `Bearer ${token}` } });
  expect(revoked.status()).toBe(401);
});
