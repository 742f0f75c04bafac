import { expect, test } from '@playwright/test';
import { completeSignUp, uniqueUser } from './helpers/accounts.ts';
import { linkInMailTo } from './helpers/mail.ts';

test('when an owner invites a colleague by e-mail, then the colleague signs up from the mail, joins as viewer and sees no settings', async ({ page, browser }) => {
  const owner = uniqueUser('Owner');
  const colleague = uniqueUser('Colleague');
  const projectName = `Argon melt ${owner.email.slice(6, 14)}`;

  await test.step('the owner signs up and lands on an empty projects page', async () => {
    await page.goto('/sign-up');
    await completeSignUp(page, owner);
    await expect(page.getByRole('heading', { name: 'Projects', level: 1 })).toBeVisible();
    await expect(page.getByRole('status')).toContainText('No projects yet');
  });

  await test.step('the owner creates a project', async () => {
    await page.getByRole('button', { name: 'New project' }).click();
    const dialog = page.getByRole('dialog', { name: 'New project' });
    await dialog.getByLabel('Project name').fill(projectName);
    await dialog.getByLabel('Description').fill('Three temperatures of a Lennard-Jones liquid.');
    await dialog.getByRole('button', { name: 'Create project' }).click();
    await expect(page.getByRole('heading', { name: projectName, level: 1 })).toBeVisible();
    await expect(page.getByText('No trajectories yet. Drop files above to upload the first.')).toBeVisible();
  });

  await test.step('the owner invites the colleague as a viewer', async () => {
    await page.getByRole('link', { name: 'Settings' }).click();
    await expect(page.getByRole('heading', { name: 'Settings', level: 1 })).toBeVisible();
    const invite = page.getByRole('form', { name: 'Invite someone' });
    await invite.getByLabel('E-mail to invite').fill(colleague.email);
    await expect(invite.getByRole('combobox', { name: 'Role' })).toContainText('Viewer');
    await invite.getByRole('button', { name: 'Send invitation' }).click();
    await expect(page.getByText(`Invitation sent to ${colleague.email}.`)).toBeVisible();
    await expect(page.getByRole('list', { name: 'Pending invitations' })).toContainText(colleague.email);
  });

  const link = await linkInMailTo(colleague.email, '/invitations/');

  await test.step('the colleague opens the mailed link in their own browser, signs up with the e-mail filled in, and joins', async () => {
    const context = await browser.newContext();
    try {
      const guest = await context.newPage();
      await guest.goto(link);
      await expect(guest.getByRole('heading', { name: `Join “${projectName}”` })).toBeVisible();
      await expect(guest.getByText(`invited ${colleague.email} to this project as a Viewer`)).toBeVisible();
      await guest.getByRole('link', { name: 'Create an account' }).click();
      await expect(guest.getByLabel('E-mail')).toHaveValue(colleague.email);
      await completeSignUp(guest, colleague);
      await guest.getByRole('button', { name: 'Join project' }).click();

      await expect(guest.getByRole('heading', { name: projectName, level: 1 })).toBeVisible();
      await expect(guest.getByText('You are a Viewer')).toBeVisible();
      await expect(guest.getByRole('link', { name: 'Settings' })).toHaveCount(0);
      await expect(guest.getByTestId('drop-zone')).toHaveCount(0);
      await expect(guest.getByRole('button', { name: 'New project' })).toHaveCount(0);

      await guest.getByRole('link', { name: 'Projects', exact: true }).click();
      const row = guest.getByRole('row', { name: new RegExp(projectName) });
      await expect(row).toContainText('Viewer');
      await expect(row).toContainText('2');
    } finally {
      await context.close();
    }
  });

  await test.step('the owner sees the colleague among the members and in the audit log', async () => {
    await page.reload();
    await expect(page.getByRole('table', { name: 'Project members' })).toContainText(colleague.name);
    await expect(page.getByRole('list', { name: 'Audit log' })).toContainText(`${colleague.name} joined as viewer`);
  });
});

test('when a visitor forgets the password, then the mailed link sets a new one and signs them in', async ({ page }) => {
  const user = uniqueUser('Forgetful');
  await page.goto('/sign-up');
  await completeSignUp(page, user);
  await expect(page.getByRole('heading', { name: 'Projects', level: 1 })).toBeVisible();
  await page.getByRole('button', { name: `Account menu for ${user.name}` }).click();
  await page.getByRole('menuitem', { name: 'Sign out' }).click();

  await expect(page.getByRole('heading', { name: 'Sign in' })).toBeVisible();
  await page.getByRole('link', { name: 'Forgot your password?' }).click();
  // Both pages have an E-mail field: fill only once the new page is the one on screen.
  await expect(page.getByRole('heading', { name: 'Forgot your password?' })).toBeVisible();
  await page.getByLabel('E-mail').fill(user.email);
  await page.getByRole('button', { name: 'Send reset link' }).click();
  await expect(page.getByRole('status')).toContainText('a reset link is on its way');

  await page.goto(await linkInMailTo(user.email, '/reset-password'));
  await expect(page.getByRole('heading', { name: 'Choose a new password' })).toBeVisible();
  await page.getByLabel('New password').fill('a-fresh-password-123');
  await page.getByRole('button', { name: 'Set password and sign in' }).click();
  await expect(page.getByRole('heading', { name: 'Projects', level: 1 })).toBeVisible();
});

test('when a form is sent with bad input, then each field says what is wrong', async ({ page }) => {
  await page.goto('/sign-up');
  await page.getByLabel('E-mail').fill('not-an-address');
  await page.getByLabel('Password').fill('short');
  await page.getByRole('button', { name: 'Create account' }).click();
  await expect(page.getByText('Enter the name your team knows you by.')).toBeVisible();
  await expect(page.getByText('This is not an e-mail address.')).toBeVisible();
  await expect(page.getByText('At least 10 characters.').last()).toBeVisible();
  await expect(page).toHaveURL(/\/sign-up/);
});
