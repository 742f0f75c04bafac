import { expect, test, type Page } from '@playwright/test';
import { mkdirSync } from 'node:fs';
import { randomWalkExtxyz } from '../support/random-walk.ts';
import { relaxingRunExtxyz } from '../support/relaxing-run.ts';
import { chooseAndUpload } from './helpers/upload.ts';
import { readyTrajectory } from './helpers/viewer-data.ts';

/** Opens the analysis dialog for a trajectory on its project page, keeps only the named analyses and starts. */
async function startAnalysis(page: Page, fileName: string, analyses: string[]): Promise<void> {
  await page.getByRole('button', { name: `Analyse ${fileName}` }).click();
  const dialog = page.getByRole('dialog', { name: `Analyse ${fileName}` });
  // The dialog opens once the server's copy of the trajectory is read: its checkboxes are counted only then.
  await expect(dialog.getByRole('button', { name: 'Start analysis' })).toBeVisible();
  for (const box of await dialog.getByRole('checkbox').all()) {
    if (await box.isChecked()) await box.uncheck();
  }
  for (const name of analyses) await dialog.getByRole('checkbox', { name }).check();
  await dialog.getByRole('button', { name: 'Start analysis' }).click();
  await expect(dialog).toBeHidden();
}

test.describe('analysis runs', () => {
  test('when two runs end while the user types on another page, then each is announced with a link to its report and the page never moves', async ({ page, context }) => {
    const bytes = await randomWalkExtxyz({ atoms: 30, frames: 60, diffusionA2PerPs: 0.5, timeStepPs: 0.1, boxA: 20, seed: 11 });
    const trajectory = await readyTrajectory(context, 'notice-walk.extxyz', bytes);
    await page.goto(`/projects/${trajectory.projectId}`);
    // Each notice shows for a while and gives way to the next; watched from the start, so a slow machine
    // that is still opening the next page when a run ends cannot make the test look too late.
    const temperatureNotice = expect(page.getByText('The analysis of notice-walk.extxyz (temperature) is done.')).toBeVisible({ timeout: 120_000 });
    const msdNotice = expect(page.getByText('The analysis of notice-walk.extxyz (MSD) is done.')).toBeVisible({ timeout: 120_000 });
    await startAnalysis(page, 'notice-walk.extxyz', ['Temperature and density']);
    await startAnalysis(page, 'notice-walk.extxyz', ['MSD and diffusion']);

    await page.getByRole('button', { name: /Account menu/ }).click();
    await page.getByRole('menuitem', { name: 'API tokens' }).click();
    await expect(page.getByRole('heading', { name: 'API tokens', level: 1 })).toBeVisible();
    const field = page.getByLabel('Token name');
    await field.fill('laptop at the beamline');

    await temperatureNotice;
    await expect(page).toHaveURL(/\/account\/tokens$/);
    await msdNotice;
    await expect(page).toHaveURL(/\/account\/tokens$/);
    await expect(field).toHaveValue('laptop at the beamline');

    await page.getByRole('button', { name: 'Open report' }).click();
    await expect(page).toHaveURL(/\/reports\/\d+$/);
  });

  test('when the project page is reloaded, then its runs come from the server, with the reason of a failed one, and stay live', async ({ page, context }) => {
    const bytes = await randomWalkExtxyz({ atoms: 30, frames: 60, diffusionA2PerPs: 0.5, timeStepPs: 0.1, boxA: 20, seed: 12 });
    const trajectory = await readyTrajectory(context, 'listed-walk.extxyz', bytes);
    await page.goto(`/projects/${trajectory.projectId}`);
    await startAnalysis(page, 'listed-walk.extxyz', ['Temperature and density']);
    // A run started by a script, not by this page: it names a species the file does not have, so it fails.
    const xsrf = decodeURIComponent((await context.cookies()).find((c) => c.name === 'XSRF-TOKEN')!.value);
    const scripted = await context.request.post(`/api/trajectories/${trajectory.id}/analyses`, {
      data: { analyses: ['msd'], params: { species: ['Xe'] } }, headers: { 'X-XSRF-TOKEN': xsrf },
    });
    expect(scripted.status()).toBe(202);

    await page.reload();
    const runs = page.getByRole('list', { name: 'Analysis runs of this project' });
    await expect(runs.getByRole('listitem')).toHaveCount(2);
    const failed = runs.getByRole('listitem').filter({ hasText: 'MSD' });
    await expect(failed).toContainText(/failed/i, { timeout: 120_000 });
    await expect(failed).toContainText('Xe');
    const done = runs.getByRole('listitem').filter({ hasText: 'temperature' });
    await expect(done.getByRole('link', { name: 'Open report' })).toBeVisible({ timeout: 120_000 });
    await expect(page.getByRole('list', { name: 'Reports in this project' }).getByRole('listitem')).toHaveCount(1);
  });

  test('when an upload is inspected, then its row in the upload list follows the inspection and sizes small files in bytes', async ({ page, context }) => {
    const trajectory = await readyTrajectory(context, 'first.extxyz', await randomWalkExtxyz({ atoms: 4, frames: 5, diffusionA2PerPs: 0.5, timeStepPs: 0.1, boxA: 10, seed: 1 }));
    await page.goto(`/projects/${trajectory.projectId}`);
    const broken = Buffer.from('2\nbroken\nAr 0 0 0\nAr 1 x 1\n');
    await chooseAndUpload(page, [{ name: 'tiny-broken.xyz', buffer: broken }]);
    const uploads = page.getByRole('list', { name: 'Uploads' });
    const row = uploads.getByRole('listitem').filter({ hasText: 'tiny-broken.xyz' });
    await expect(row).toContainText(`${broken.length} bytes`);
    await expect(row).toContainText(/Inspection failed: .*line 4/, { timeout: 60_000 });
    await expect(row).not.toContainText('inspecting');
  });

  test('when a file is over the site\'s upload limit, then it is refused before a byte is sent, naming its size, the limit and what to do', async ({ page, context }) => {
    const trajectory = await readyTrajectory(context, 'small.extxyz', await randomWalkExtxyz({ atoms: 4, frames: 5, diffusionA2PerPs: 0.5, timeStepPs: 0.1, boxA: 10, seed: 2 }));
    // The site's policy as the server states it, with a limit of 1 KiB so a small file can stand for a multi-GB one.
    await page.route('**/api/upload-policy', (route) => route.fulfill({ json: { uploadPolicy: { fileMaxBytes: 1024, decompressedMaxBytes: 1024 ** 3, decompressionMaxRatio: 1000 } } }));
    const posted: string[] = [];
    page.on('request', (r) => {
      if (r.method() === 'POST' && r.url().endsWith(`/api/projects/${trajectory.projectId}/trajectories`)) posted.push(r.url());
    });
    await page.goto(`/projects/${trajectory.projectId}`);
    await chooseAndUpload(page, [{ name: 'long-run.extxyz', buffer: Buffer.alloc(3 * 1024, 65) }]);
    const row = page.getByRole('list', { name: 'Uploads' }).getByRole('listitem').filter({ hasText: 'long-run.extxyz' });
    await expect(row.getByRole('alert')).toHaveText('long-run.extxyz is 3.0 KiB, larger than the upload limit of 1.0 KiB. Compress it with gzip or zip (text trajectories shrink several-fold, and are read compressed), or ask the site administrator to raise UPLOAD_MAX_BYTES.');
    expect(posted).toEqual([]);
  });

  test('when the server estimates a run past the site\'s limits, then the dialog shows the time, memory and scratch disk, each piece of advice, and will not start it', async ({ page, context }) => {
    const trajectory = await readyTrajectory(context, 'long-run.extxyz', await randomWalkExtxyz({ atoms: 4, frames: 50, diffusionA2PerPs: 0.5, timeStepPs: 0.1, boxA: 10, seed: 4 }));
    // The estimate of a run far longer than this file, as the server states one for a multi-GB upload.
    const estimate = {
      seconds: 9 * 3600, memoryBytes: 300 * 1024 ** 2, scratchBytes: 12 * 1024 ** 3,
      analyses: [{ key: 'msd', seconds: 9 * 3600 }],
      frames: { from: 0, to: 50, stride: 1, used: 50, discarded: 0, autoStride: false },
      rMaxA: null, limits: { seconds: 4 * 3600, memoryBytes: 4 * 1024 ** 3 }, withinLimits: false,
      advice: ['Analyse one frame in 3 (frame stride 3): 17 frames instead of 50.', 'Analyse a shorter frame range: at most 22 frames at stride 1.'],
    };
    await page.route('**/api/trajectories/*/analyses/estimate', (route) => route.fulfill({ json: { estimate } }));
    await page.goto(`/projects/${trajectory.projectId}`);
    await page.getByRole('button', { name: 'Analyse long-run.extxyz' }).click();
    const dialog = page.getByRole('dialog');
    await expect(dialog.getByText('Estimated about 9.0 h and 300 MiB of memory (the frames wait in 12 GiB of scratch disk), on 50 frames')).toBeVisible();
    const refusal = dialog.getByRole('alert').filter({ hasText: 'This is past what this site runs' });
    await expect(refusal).toContainText('This is past what this site runs (about 4.0 h and 4.0 GiB). Any one of these brings it within:');
    await expect(refusal.getByRole('listitem')).toHaveText(estimate.advice);
    await expect(dialog.getByRole('button', { name: 'Start analysis' })).toBeDisabled();
  });

  test('when a run needs its start discarded, then the dialog offers the discard, estimates the run as frames are chosen, and the report names the frames used', async ({ page, context }) => {
    const trajectory = await readyTrajectory(context, 'relaxing.extxyz', await relaxingRunExtxyz());
    await page.goto(`/projects/${trajectory.projectId}`);
    await page.getByRole('button', { name: 'Analyse relaxing.extxyz' }).click();
    const dialog = page.getByRole('dialog');
    await expect(dialog).toContainText(/Inspection judged the run equilibrated from frame \d+ \(about [\d.]+ ps\), from the kinetic energy/);
    await expect(dialog.getByText(/Estimated .* on 400 frames/)).toBeVisible();
    await dialog.getByRole('button', { name: /Discard the first [\d.]+ ps/ }).click();
    await dialog.getByRole('button', { name: 'Advanced settings' }).click();
    await dialog.getByLabel('Stride').fill('2');
    // Frames are counted from 1 here, as in the viewer: 0 is refused, 1 to 400 is the whole run.
    await dialog.getByLabel('From frame').fill('0');
    await dialog.getByLabel('From frame').blur();
    await expect(dialog.getByText('The first frame must be at least 1 (frames are counted from 1; this trajectory\'s frames are 1 to 400).')).toBeVisible();
    await dialog.getByLabel('To frame (included)').fill('401');
    await dialog.getByLabel('To frame (included)').blur();
    await expect(dialog.getByText('The last frame must be at most 400; this trajectory\'s frames are 1 to 400.')).toBeVisible();
    await dialog.getByLabel('From frame').fill('1');
    await dialog.getByLabel('To frame (included)').fill('400');
    await expect(dialog.getByText(/Estimated .* frames \(from frame \d+ to 400, every 2\)/)).toBeVisible();
    await screens(page, 'analysis-dialog-frames');
    for (const box of await dialog.getByRole('checkbox').all()) {
      if (await box.isChecked()) await box.uncheck();
    }
    await dialog.getByRole('checkbox', { name: 'Temperature and density' }).check();
    await dialog.getByRole('button', { name: 'Start analysis' }).click();
    await expect(dialog).toBeHidden();
    await expect(page.getByText('The analysis of relaxing.extxyz (temperature) is done.')).toBeVisible({ timeout: 120_000 });
    await page.getByRole('button', { name: 'Open report' }).click();
    await expect(page.getByText(/Analysed \d+ frames, from frame \d+ up to frame 400, every 2nd frame\. The first [\d.]+ ps of the range \(\d+ frames\) were left out for equilibration\./)).toBeVisible();
  });
});

/** The page at the desktop and the phone size the product is checked at. */
async function screens(page: Page, name: string): Promise<void> {
  mkdirSync('test-results/screens', { recursive: true });
  for (const [label, size] of [['desktop', { width: 1440, height: 900 }], ['phone', { width: 390, height: 844 }]] as const) {
    await page.setViewportSize(size);
    await page.screenshot({ path: `test-results/screens/${name}-${label}.png` });
  }
  await page.setViewportSize({ width: 1440, height: 900 });
}
