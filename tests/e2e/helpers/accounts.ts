import { randomUUID } from 'node:crypto';
import { expect, type Page } from '@playwright/test';

export interface E2eUser {
  name: string;
  email: string;
  password: string;
}

export function uniqueUser(label: string): E2eUser {
  const id = randomUUID().slice(0, 8);
  return { name: `${label} ${id}`, email: `${label.toLowerCase()}-${id}@ergodic-e2e.example`, password: `e2e-${randomUUID()}` };
}

/** Fills the sign-up form already on screen; the e-mail may be pre-filled by an invitation. */
export async function completeSignUp(page: Page, user: E2eUser): Promise<void> {
  await expect(page.getByRole('heading', { name: 'Create an account' })).toBeVisible();
  await page.getByLabel('Your name').fill(user.name);
  await page.getByLabel('E-mail').fill(user.email);
  await page.getByLabel('Password').fill(user.password);
  await page.getByRole('button', { name: 'Create account' }).click();
}
