import { mkdirSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import { completeSignUp, uniqueUser, type E2eUser } from './helpers/accounts.ts';
import { addProjectOwner, makeSiteAdmin } from './helpers/direct-db.ts';

const SCREENS = 'test-results/screens';

/** The open dialog at a desktop and a phone size. */
async function screens(page: Page, name: string): Promise<void> {
  mkdirSync(SCREENS, { recursive: true });
  for (const [label, width, height] of [['1440', 1440, 900], ['390', 390, 844]] as const) {
    await page.setViewportSize({ width, height });
    await expect(page.getByRole('dialog')).toBeVisible();
    await page.screenshot({ path: `${SCREENS}/${name}-${label}.png` });
  }
  await page.setViewportSize({ width: 1440, height: 900 });
}

async function signUp(page: Page, label: string): Promise<E2eUser> {
  const user = uniqueUser(label);
  await page.goto('/sign-up');
  await completeSignUp(page, user);
  await expect(page.getByRole('button', { name: `Account menu for ${user.name}` })).toBeVisible();
  return user;
}

test.describe('confirmation before changes that are hard to undo', () => {
  test.use({ viewport: { width: 1440, height: 900 } });

  test('when a token is revoked, then the user is asked first, and keeping it leaves it working', async ({ page }) => {
    await signUp(page, 'Revoker');
    await page.goto('/account/tokens');
    await page.getByLabel('Token name').fill('nightly analysis');
    await page.getByRole('button', { name: 'Create token' }).click();
    const table = page.getByRole('table', { name: 'Your API tokens' });
    await expect(table.getByRole('row', { name: /nightly analysis/ })).toContainText('Active');

    await page.getByRole('button', { name: 'Revoke token nightly analysis' }).click();
    const dialog = page.getByRole('dialog', { name: 'Revoke token “nightly analysis”?' });
    await expect(dialog).toContainText('cannot be brought back');
    await screens(page, 'confirm-revoke-token');
    await dialog.getByRole('button', { name: 'Keep it' }).click();
    await expect(dialog).toBeHidden();
    await expect(table.getByRole('row', { name: /nightly analysis/ })).toContainText('Active');

    await page.getByRole('button', { name: 'Revoke token nightly analysis' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Revoke token' }).click();
    await expect(table.getByRole('row', { name: /nightly analysis/ })).toContainText('Revoked');
  });

  test('when an admin disables a user or makes one admin, then they are asked first; cancelling changes nothing', async ({ page, browser }) => {
    const other = uniqueUser('Analyst');
    const otherContext = await browser.newContext();
    try {
      const otherPage = await otherContext.newPage();
      await otherPage.goto('/sign-up');
      await completeSignUp(otherPage, other);
      await expect(otherPage.getByRole('button', { name: `Account menu for ${other.name}` })).toBeVisible();
    } finally {
      await otherContext.close();
    }
    const admin = await signUp(page, 'Steward');
    await makeSiteAdmin(admin.email);
    await page.goto('/admin/users');
    const row = page.getByRole('row', { name: new RegExp(other.name) });
    await expect(row).toContainText('Active');

    await page.getByRole('button', { name: `Disable ${other.name}` }).click();
    const disable = page.getByRole('dialog', { name: `Disable ${other.name}?` });
    await expect(disable).toContainText('signed out everywhere');
    await screens(page, 'confirm-disable-user');
    await disable.getByRole('button', { name: 'Cancel' }).click();
    await expect(disable).toBeHidden();
    await expect(row).toContainText('Active');
    await page.getByRole('button', { name: `Disable ${other.name}` }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Disable account' }).click();
    await expect(row).toContainText('Disabled');
    // Enabling again restores what was lost, so it needs no question.
    await page.getByRole('button', { name: `Enable ${other.name}` }).click();
    await expect(row).toContainText('Active');
    await expect(page.getByRole('dialog')).toHaveCount(0);

    await page.getByRole('button', { name: `Make admin: ${other.name}` }).click();
    const promote = page.getByRole('dialog', { name: `Make ${other.name} a site admin?` });
    await expect(promote).toContainText('manage every account');
    await screens(page, 'confirm-make-admin');
    await promote.getByRole('button', { name: 'Make admin' }).click();
    await expect(row).toContainText('Admin');
  });

  test('when the only owner would leave, then Leave is disabled and says why; when an owner leaves a project, then they are asked first, and after leaving they are back at their projects without it', async ({ page, context, browser }) => {
    const partner = uniqueUser('Coowner');
    const partnerContext = await browser.newContext();
    try {
      const partnerPage = await partnerContext.newPage();
      await partnerPage.goto('/sign-up');
      await completeSignUp(partnerPage, partner);
      await expect(partnerPage.getByRole('button', { name: `Account menu for ${partner.name}` })).toBeVisible();
    } finally {
      await partnerContext.close();
    }
    await signUp(page, 'Leaver');
    const token = decodeURIComponent((await context.cookies()).find((c) => c.name === 'XSRF-TOKEN')!.value);
    const made = await context.request.post('/api/projects', { data: { name: 'Larkspur glass transition' }, headers: { 'X-XSRF-TOKEN': token } });
    expect(made.status(), await made.text()).toBe(201);
    const projectId = ((await made.json()) as { project: { id: number } }).project.id;

    // The only owner is not offered a leave the server would refuse, and is told why.
    await page.goto(`/projects/${projectId}/settings`);
    const alone = page.getByRole('button', { name: 'Leave this project' });
    await expect(alone).toBeDisabled();
    await expect(alone).toHaveAccessibleDescription('You are the only owner. Make another member an owner first, or delete the project.');

    await addProjectOwner(projectId, partner.email);
    await page.goto(`/projects/${projectId}/settings`);
    const members = page.getByRole('table', { name: 'Project members' });
    await expect(members).toContainText(partner.name);
    await page.getByRole('button', { name: 'Leave this project' }).click();
    const leave = page.getByRole('dialog', { name: 'Leave this project?' });
    await expect(leave).toContainText('Only an owner can add you again');
    await screens(page, 'confirm-leave-project');
    await leave.getByRole('button', { name: 'Stay' }).click();
    await expect(leave).toBeHidden();
    await expect(page).toHaveURL(new RegExp(`/projects/${projectId}/settings$`));

    await page.getByRole('button', { name: 'Leave this project' }).click();
    await page.getByRole('dialog').getByRole('button', { name: 'Leave the project' }).click();
    await expect(page).toHaveURL(/\/projects$/);
    await expect(page.getByRole('link', { name: 'Larkspur glass transition' })).toHaveCount(0);
  });
});
