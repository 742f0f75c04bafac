import { expect, test } from '@playwright/test';
import { randomWalkExtxyz } from '../support/random-walk.ts';
import { seedReport } from './helpers/report-data.ts';

test('when a report is run again and run again with another fit window, then the three reports are told apart and can be filtered and sorted', async ({ page, context }) => {
  test.setTimeout(300_000);
  const bytes = await randomWalkExtxyz({ atoms: 60, frames: 120, diffusionA2PerPs: 0.5, timeStepPs: 0.1, boxA: 25, seed: 21 });
  const { reportId, projectId } = await seedReport(context, 'rerun-walk.extxyz', bytes, ['msd']);
  await page.goto(`/reports/${reportId}`);
  await expect(page.getByRole('heading', { level: 1, name: 'rerun-walk.extxyz: MSD' })).toBeVisible();

  await test.step('run again with the same settings, told when done, without leaving the page', async () => {
    await page.getByRole('button', { name: 'Run again with these settings' }).click();
    await expect(page.getByText(/Started again: MSD of rerun-walk\.extxyz/)).toBeVisible();
    await expect(page.getByText('The analysis of rerun-walk.extxyz (MSD) is done.')).toBeVisible({ timeout: 120_000 });
    await expect(page).toHaveURL(new RegExp(`/reports/${reportId}$`));
    await page.getByRole('button', { name: 'Open report' }).click();
    await expect(page).not.toHaveURL(new RegExp(`/reports/${reportId}$`));
    await expect(page.getByRole('heading', { level: 1, name: 'rerun-walk.extxyz: MSD' })).toBeVisible();
  });

  await test.step('adjust: the dialog starts from this report\'s settings; a manual fit window and a note', async () => {
    await page.getByRole('button', { name: 'Adjust and run' }).click();
    const dialog = page.getByRole('dialog', { name: /Adjust and run rerun-walk\.extxyz/ });
    await expect(dialog.getByRole('checkbox', { name: 'MSD and diffusion' })).toBeChecked();
    await expect(dialog.getByRole('checkbox', { name: 'Temperature and density' })).not.toBeChecked();
    await dialog.getByRole('combobox', { name: 'Fit window' }).click();
    await page.getByRole('option', { name: 'Manual' }).click();
    await dialog.getByLabel('Fit from (ps)').fill('1');
    await dialog.getByLabel('Fit to (ps)').fill('3');
    await dialog.getByLabel('Notes for this run').fill('early window, for the appendix');
    await dialog.getByRole('button', { name: 'Start analysis' }).click();
    await expect(dialog).toBeHidden();
    await expect(page.getByText('The analysis of rerun-walk.extxyz (MSD) is done.')).toBeVisible({ timeout: 120_000 });
    await page.getByRole('button', { name: 'Open report' }).click();
    await expect(page.getByRole('heading', { level: 1, name: 'rerun-walk.extxyz: MSD — fit 1–3 ps' })).toBeVisible();
    await expect(page.getByText('early window, for the appendix')).toBeVisible();
  });

  await test.step('the project lists three reports with their key numbers; filter and sort', async () => {
    await page.goto(`/projects/${projectId}`);
    const list = page.getByRole('list', { name: 'Reports in this project' });
    await expect(list.getByRole('listitem')).toHaveCount(3);
    await expect(list.getByRole('listitem').first()).toContainText(/D = [\d.]+ ± [\d.]+ × 10⁻⁹ m²\/s \(Einstein\)/);
    await page.getByLabel('Filter reports').fill('appendix');
    await expect(list.getByRole('listitem')).toHaveCount(1);
    await expect(list.getByRole('listitem')).toContainText('fit 1–3 ps');
    await page.getByLabel('Filter reports').fill('');
    await page.getByRole('combobox', { name: 'Sort reports' }).click();
    await page.getByRole('option', { name: 'Oldest first' }).click();
    await expect(list.getByRole('link').first()).toHaveAttribute('href', `/reports/${reportId}`);
  });
});
