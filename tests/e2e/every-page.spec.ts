import { expect, test } from '@playwright/test';
import { lennardJonesExtxyz } from '../support/fixtures.ts';
import { asThreeSpecies } from './helpers/mixture.ts';
import { captureAtBothSizes } from './helpers/screens.ts';
import { argonLikeModel, seedProjectWithModel } from './helpers/seed-energy.ts';
import { makeSiteAdmin } from './helpers/site-admin.ts';

/**
 * Every page and dialog at a desktop (1440×900) and a phone (390×844): a
 * screenshot of each for people to look at, and a failure when anything is
 * wider than the window, so nothing needs sideways scrolling on a phone.
 */
test('when every page and dialog is opened at 1440 and 390 px, then none is wider than the window', async ({ page, context, browser }) => {
  test.setTimeout(420_000);

  await test.step('signed out: sign in, sign up, forgot password', async () => {
    const guest = await browser.newPage();
    try {
      await guest.goto('/sign-in');
      await expect(guest.getByRole('heading', { name: 'Sign in' })).toBeVisible();
      await captureAtBothSizes(guest, 'sign-in');
      await guest.goto('/sign-up');
      await expect(guest.getByRole('heading', { name: 'Create an account' })).toBeVisible();
      await captureAtBothSizes(guest, 'sign-up');
      await guest.goto('/forgot-password');
      await expect(guest.getByRole('button', { name: 'Send reset link' })).toBeVisible();
      await captureAtBothSizes(guest, 'forgot-password');
    } finally {
      await guest.close();
    }
  });

  const { bytes } = await lennardJonesExtxyz();
  const seeded = await seedProjectWithModel(context, 'larkspur-noble-mixture-86K-production.extxyz', asThreeSpecies(bytes),
    ['thermo', 'msd', 'vacf', 'vdos', 'rdf', 'sq', 'lindemann', 'ngp', 'energy'], argonLikeModel(['Ar', 'Kr', 'Ne']));
  await makeSiteAdmin(seeded.email);

  await test.step('projects, and the new-project dialog', async () => {
    await page.goto('/projects');
    await expect(page.getByRole('heading', { name: 'Projects', level: 1 })).toBeVisible();
    await captureAtBothSizes(page, 'projects');
    await page.getByRole('button', { name: 'New project' }).click();
    const dialog = page.getByRole('dialog', { name: 'New project' });
    await expect(dialog).toBeVisible();
    // Name and description stack at the dialog's full width, the description's hint shown whole.
    // Polled: while the dialog's opening animation runs, the two boxes may be read at different scales.
    const boxes = async () => ({
      name: (await dialog.getByLabel('Project name').boundingBox())!,
      description: (await dialog.getByLabel('Description').boundingBox())!,
    });
    await expect.poll(async () => {
      const { name, description } = await boxes();
      return Math.abs(description.width - name.width);
    }).toBeLessThan(2);
    const { name, description } = await boxes();
    expect(description.y).toBeGreaterThan(name.y + name.height);
    await expect(dialog.getByText('Optional: the system, the question, the people.')).toBeVisible();
    await captureAtBothSizes(page, 'new-project-dialog', { within: dialog });
    await page.keyboard.press('Escape');
    await expect(dialog).toBeHidden();
  });

  await test.step('the project page, the upload dialog, the metadata form', async () => {
    await page.goto(`/projects/${seeded.projectId}`);
    await test.step('the first Tab reaches a skip link to the page itself; the hidden file input is never reached', async () => {
      const skip = page.getByRole('link', { name: 'Skip to main content' });
      // Tab only once the page is drawn: a Tab pressed while the app still starts lands on nothing.
      await expect(page.getByRole('button', { name: 'Choose files…' })).toBeVisible();
      await expect(skip).toBeAttached();
      await page.keyboard.press('Tab');
      await expect(skip).toBeFocused();
      await skip.press('Enter');
      await expect(page.locator('main#main-content')).toBeFocused();
      await expect(page.locator('input[type=file]')).toHaveAttribute('tabindex', '-1');
    });
    await expect(page.getByRole('heading', { level: 1 })).toBeVisible();
    await expect(page.getByRole('list', { name: 'Reports in this project' }).getByRole('listitem')).toHaveCount(1);
    await captureAtBothSizes(page, 'project');

    const choosing = page.waitForEvent('filechooser');
    await page.getByRole('button', { name: 'Choose files…' }).click();
    await (await choosing).setFiles([{ name: 'larkspur-quench-step-2.xyz', mimeType: 'text/plain', buffer: Buffer.from('1\nx\nAr 0 0 0\n') }]);
    const upload = page.getByRole('dialog', { name: /^Upload / });
    await expect(upload).toBeVisible();
    await captureAtBothSizes(page, 'upload-dialog', { within: upload });
    await upload.getByRole('button', { name: 'Cancel' }).click();
    await expect(upload).toBeHidden();

    await page.getByRole('button', { name: 'More actions for larkspur-noble-mixture-86K-production.extxyz' }).click();
    await page.getByRole('menuitem', { name: 'Edit metadata' }).click();
    const metadata = page.getByRole('dialog', { name: /^Metadata of / });
    await expect(metadata).toBeVisible();
    await captureAtBothSizes(page, 'metadata-dialog', { within: metadata });
    await page.keyboard.press('Escape');
    await expect(metadata).toBeHidden();
  });

  await test.step('the analysis dialog with its advanced settings open', async () => {
    await page.getByRole('button', { name: 'Analyse larkspur-noble-mixture-86K-production.extxyz' }).click();
    const dialog = page.getByRole('dialog', { name: /^Analyse / });
    await dialog.getByRole('button', { name: 'Advanced settings' }).click();
    const fitWindow = dialog.getByRole('combobox', { name: 'Fit window' });
    await fitWindow.click();
    await page.getByRole('option', { name: 'Manual' }).click();
    await dialog.getByLabel('Fit from (ps)').fill('2');
    await dialog.getByLabel('Zero padding (×)').fill('1.5');
    await dialog.getByRole('button', { name: 'Start analysis' }).click();
    // Each problem in words beneath its own field; no parameter's internal name anywhere.
    const fitTo = dialog.locator('mat-form-field').filter({ has: page.getByLabel('Fit to (ps)') });
    await expect(fitTo.getByText('Give the end of the fit window, in ps.')).toBeVisible();
    const padding = dialog.locator('mat-form-field').filter({ has: page.getByLabel('Zero padding (×)') });
    await expect(padding.getByText('The zero padding must be a whole number.')).toBeVisible();
    await expect(dialog).not.toContainText(/fitWindow|zeroPadFactor/);
    await captureAtBothSizes(page, 'analysis-dialog', { within: dialog.locator('mat-dialog-content'), ready: () => fitWindow.scrollIntoViewIfNeeded() });
    await page.keyboard.press('Escape');
    await expect(dialog).toBeHidden();
  });

  await test.step('the interaction-model editor', async () => {
    await page.getByRole('button', { name: 'More actions for larkspur-noble-mixture-86K-production.extxyz' }).click();
    await page.getByRole('menuitem', { name: 'Interaction model' }).click();
    const dialog = page.getByRole('dialog', { name: /^Interaction model/ });
    await expect(dialog).toBeVisible();
    await captureAtBothSizes(page, 'interaction-model-dialog', { within: dialog.locator('mat-dialog-content') });
    await page.keyboard.press('Escape');
    await expect(dialog).toBeHidden();
  });

  await test.step('the report and its share dialog', async () => {
    await page.goto(`/reports/${seeded.reportId}`);
    await expect(page.getByRole('heading', { level: 1, name: /larkspur-noble-mixture/ })).toBeVisible();
    await expect(page.getByRole('img', { name: /g\(r\) against distance/ })).toBeVisible();
    // Species are switched on and off with toggles above a chart rather than paged through in its legend.
    const msdSpecies = page.getByRole('group', { name: 'Species shown in Mean-square displacement' });
    await expect(msdSpecies.getByRole('button')).toHaveText(['all', 'Ar', 'Kr', 'Ne']);
    await msdSpecies.getByRole('button', { name: 'Kr' }).click();
    await expect(msdSpecies.getByRole('button', { name: 'Kr' })).toHaveAttribute('aria-pressed', 'false');
    await expect(msdSpecies.getByRole('button', { name: 'Ar' })).toHaveAttribute('aria-pressed', 'true');
    await captureAtBothSizes(page, 'report');
    await page.getByRole('button', { name: 'Share' }).click();
    const share = page.getByRole('dialog');
    await expect(share.getByRole('list', { name: 'Project members' })).toContainText(seeded.displayName);
    await captureAtBothSizes(page, 'share-dialog', { within: share.locator('mat-dialog-content') });
    await page.keyboard.press('Escape');
    await expect(share).toBeHidden();
  });

  await test.step('the frame viewer', async () => {
    await page.goto(`/trajectories/${seeded.trajectoryId}/view`);
    await expect(page.getByRole('img', { name: /3D view of frame 1 of/ })).toBeVisible();
    await captureAtBothSizes(page, 'viewer');
  });

  await test.step('tokens, project settings, admin users, sent mail, not found', async () => {
    await page.goto('/account/tokens');
    await page.getByLabel('Token name').fill('larkspur nightly upload from the cluster head node');
    await page.getByRole('button', { name: /Create token/ }).click();
    await expect(page.getByRole('heading', { name: 'Your tokens' })).toBeVisible();
    await expect(page.getByText('larkspur nightly upload from the cluster head node').first()).toBeVisible();
    await captureAtBothSizes(page, 'tokens');

    await page.goto(`/projects/${seeded.projectId}/settings`);
    const invite = page.getByRole('form', { name: 'Invite someone' });
    await invite.getByLabel('E-mail to invite').fill(`colleague-with-a-long-address-${seeded.projectId}@larkspur-materials-lab.example`);
    await invite.getByRole('button', { name: 'Send invitation' }).click();
    await expect(page.getByRole('list', { name: 'Pending invitations' })).toContainText('colleague-with-a-long-address');
    await expect(page.getByRole('heading', { name: 'Settings', level: 1 })).toBeVisible();
    await expect(page.getByRole('list', { name: 'Audit log' })).toBeVisible();
    await captureAtBothSizes(page, 'settings');

    await page.goto('/admin/users');
    await expect(page.getByRole('heading', { name: 'Users', level: 1 })).toBeVisible();
    await expect(page.getByText(seeded.email)).toBeVisible();
    await captureAtBothSizes(page, 'admin-users');

    await page.goto('/admin/mail');
    await expect(page.getByRole('heading', { name: 'Sent mail', level: 1 })).toBeVisible();
    await expect(page.getByText(/to colleague-with-a-long-address/).first()).toBeVisible();
    await captureAtBothSizes(page, 'admin-mail', {
      ready: async () => {
        // Rows grow with their subject: no header overlaps the next.
        const headers = page.locator('mat-expansion-panel-header');
        const boxes = await Promise.all((await headers.all()).map((h) => h.boundingBox()));
        for (let i = 1; i < boxes.length; i++) expect(boxes[i]!.y).toBeGreaterThanOrEqual(boxes[i - 1]!.y + boxes[i - 1]!.height - 1);
      },
    });

    await page.goto('/no/such/page');
    await expect(page.getByRole('heading', { name: 'Page not found' })).toBeVisible();
    await captureAtBothSizes(page, 'not-found');
  });
});
