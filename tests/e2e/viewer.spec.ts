import { mkdirSync } from 'node:fs';
import { expect, test, type Page } from '@playwright/test';
import { decodeFramesPayload } from '../../src/app/viewer/frames-payload-decoder.ts';
import { lennardJonesExtxyz } from '../support/fixtures.ts';
import { syntheticSystemExtxyz } from '../support/synthetic-system.ts';
import { elementColour } from '../../shared/element-colour.ts';
import { ELEMENTS } from '../../shared/elements.ts';
import { canvasPixels } from './helpers/canvas-pixels.ts';
import { readyTrajectory, settledTrajectory } from './helpers/viewer-data.ts';

/** The viewer's background, #eef2f3. */
const BACKGROUND: [number, number, number] = [0xee, 0xf2, 0xf3];
const SCREENS = 'test-results/screens';

async function screen(page: Page, name: string): Promise<void> {
  mkdirSync(SCREENS, { recursive: true });
  await page.screenshot({ path: `${SCREENS}/${name}.png` });
}

test.describe('frame viewer', () => {
  test.use({ viewport: { width: 1280, height: 800 } });

  test('when a ready trajectory is opened, then it is drawn, plays, and a clicked atom shows its identity and position', async ({ page, context }) => {
    const { run, bytes } = await lennardJonesExtxyz();
    const trajectory = await readyTrajectory(context, 'argon-liquid.extxyz', bytes);
    const frames = run.trajectory.nFrames;
    const atoms = run.trajectory.nAtoms;

    await page.goto(`/trajectories/${trajectory.id}/view`);

    await expect(page.getByRole('heading', { name: 'Frame viewer', level: 1 })).toBeVisible();
    const info = page.getByRole('region', { name: 'This frame' });
    await expect(info).toContainText(`1 / ${frames}`);
    await expect(info).toContainText(String(atoms));
    await expect(page.getByRole('listbox', { name: 'Species shown' }).getByRole('option', { name: `Ar, ${atoms} atoms` })).toBeVisible();
    const canvas = page.getByRole('img', { name: /3D view of frame 1 of/ });
    await expect(canvas).toBeVisible();
    await expect(page.getByText('Loading frames…')).toBeHidden();

    // Spheres and cell lines cover a good part of the view, and at least one sphere is big enough to click.
    let pixels = await canvasPixels(page, canvas, BACKGROUND);
    await expect.poll(async () => (pixels = await canvasPixels(page, canvas, BACKGROUND)).drawn / (pixels.width * pixels.height)).toBeGreaterThan(0.05);
    expect(pixels.solidPoint).not.toBeNull();
    await screen(page, 'viewer-first-frame');

    await canvas.click({ position: pixels.solidPoint! });
    const selected = page.getByRole('region', { name: 'Selected atom' });
    await expect(selected).toContainText('Species');
    await expect(selected).toContainText('Ar');
    await expect(selected).toContainText('Position in frame 1.');
    const index = Number(/Index\s*(\d+)/.exec((await selected.textContent()) ?? '')?.[1]);
    expect(index).toBeGreaterThanOrEqual(0);
    expect(index).toBeLessThan(atoms);
    await expect(selected).toContainText(new RegExp(`Atom number\\s*${index + 1}\\b`));
    // The position shown is the one the frames API holds for that atom in the first frame.
    const payload = decodeFramesPayload(await (await context.request.get(`/api/trajectories/${trajectory.id}/frames?from=0&to=1`)).body().then((b) => b.buffer.slice(b.byteOffset, b.byteOffset + b.byteLength) as ArrayBuffer));
    const x = payload.frames[0]!.positions[index * 3]!;
    await expect(selected).toContainText(new RegExp(`x\\s*${x.toFixed(3).replace('.', '\\.')} Å`));
    await screen(page, 'viewer-selected-atom');

    await page.getByRole('button', { name: 'Play', exact: true }).click();
    const slider = page.getByRole('slider', { name: 'Frame' });
    await expect.poll(async () => Number(await slider.inputValue())).toBeGreaterThan(2);
    await expect(info).not.toContainText(`1 / ${frames}`);
    await page.getByRole('button', { name: 'Pause', exact: true }).click();
    const paused = Number(await slider.inputValue());
    await expect(info).toContainText(`${paused + 1} / ${frames}`);

    // The selection follows the atom through the frames and can draw its recent path.
    await expect(selected).toContainText(`Position in frame ${paused + 1}.`);
    await page.getByRole('switch', { name: 'Path of the selected atom' }).click();
    await screen(page, 'viewer-path');

    await page.getByRole('heading', { name: 'Frame viewer' }).click();
    await page.keyboard.press('ArrowRight');
    await expect(info).toContainText(`${paused + 2} / ${frames}`);
    await page.keyboard.press('Home');
    await expect(info).toContainText(`1 / ${frames}`);
    await page.keyboard.press('Space');
    await expect(page.getByRole('button', { name: 'Pause', exact: true })).toBeVisible();
    await page.keyboard.press('Space');
    await expect(page.getByRole('button', { name: 'Play', exact: true })).toBeVisible();
  });

  test('when a large system is opened, then its atoms are drawn as sprites and can still be picked', async ({ page, context }) => {
    // Above 10 000 atoms the viewer switches from meshes to sprites.
    const trajectory = await readyTrajectory(context, 'argon-12k.extxyz', syntheticSystemExtxyz(12_000, 3));
    await page.goto(`/trajectories/${trajectory.id}/view`);
    const canvas = page.getByRole('img', { name: /3D view of frame 1 of 3, 12000 atoms/ });
    let pixels = await canvasPixels(page, canvas, BACKGROUND);
    await expect.poll(async () => (pixels = await canvasPixels(page, canvas, BACKGROUND)).drawn / (pixels.width * pixels.height)).toBeGreaterThan(0.1);

    // Zoomed in, single atoms are large enough to aim at.
    await canvas.hover();
    for (let k = 0; k < 4; k++) await page.mouse.wheel(0, -400);
    await expect.poll(async () => (pixels = await canvasPixels(page, canvas, BACKGROUND)).solidPoint).not.toBeNull();
    await canvas.click({ position: pixels.solidPoint! });

    const selected = page.getByRole('region', { name: 'Selected atom' });
    await expect(selected).toContainText('Ar');
    const index = Number(/Index\s*(\d+)/.exec((await selected.textContent()) ?? '')?.[1]);
    const body = await (await context.request.get(`/api/trajectories/${trajectory.id}/frames?from=0&to=1`)).body();
    const payload = decodeFramesPayload(body.buffer.slice(body.byteOffset, body.byteOffset + body.byteLength) as ArrayBuffer);
    await expect(selected).toContainText(new RegExp(`z\\s*${payload.frames[0]!.positions[index * 3 + 2]!.toFixed(3).replace('.', '\\.')} Å`));
    await screen(page, 'viewer-large-system');
  });

  test('when a system holds several elements, then each species is drawn and listed in its element’s colour', async ({ page, context }) => {
    // A made-up mixed oxide with water and a chloride: light and heavy elements from five groups.
    const species = ['O', 'H', 'Si', 'Na', 'Cl', 'Fe', 'Au', 'Ar'];
    const lines = Array.from({ length: 64 }, (_, a) => {
      const x = (a % 4) * 3 + 1.5, y = (Math.floor(a / 4) % 4) * 3 + 1.5, z = Math.floor(a / 16) * 3 + 1.5;
      return `${species[a % species.length]} ${x} ${y} ${z}`;
    });
    const frame = (t: number) => `64\nLattice="12 0 0 0 12 0 0 0 12" Properties=species:S:1:pos:R:3 Time=${t} pbc="T T T"\n${lines.join('\n')}\n`;
    const trajectory = await readyTrajectory(context, 'larkspur-mixed-oxide.extxyz', Buffer.from(frame(0) + frame(0.1)));
    await page.setViewportSize({ width: 1440, height: 900 });
    await page.goto(`/trajectories/${trajectory.id}/view`);
    const canvas = page.getByRole('img', { name: /3D view of frame 1 of/ });
    await expect.poll(async () => (await canvasPixels(page, canvas, BACKGROUND)).solidPoint).not.toBeNull();

    const list = page.getByRole('listbox', { name: 'Species shown' });
    for (const symbol of species) {
      const swatch = list.getByRole('option', { name: `${symbol}, 8 atoms` }).locator('.swatch');
      const [r, g, b] = [1, 3, 5].map((i) => parseInt(elementColour(ELEMENTS.get(symbol)!.atomicNumber).slice(i, i + 2), 16));
      await expect(swatch).toHaveCSS('background-color', `rgb(${r}, ${g}, ${b})`);
    }
    await screen(page, 'viewer-elements-1440');
    await page.setViewportSize({ width: 390, height: 844 });
    await expect(canvas).toBeVisible();
    await page.screenshot({ path: `${SCREENS}/viewer-elements-390.png`, fullPage: true });
  });

  test('when a species is switched off, then its spheres disappear from the view', async ({ page, context }) => {
    const { bytes } = await lennardJonesExtxyz({ productionSteps: 200 });
    const trajectory = await readyTrajectory(context, 'argon-short.extxyz', bytes);
    await page.goto(`/trajectories/${trajectory.id}/view`);
    const canvas = page.getByRole('img', { name: /3D view of frame 1 of/ });
    await expect.poll(async () => (await canvasPixels(page, canvas, BACKGROUND)).solidPoint).not.toBeNull();

    await page.getByRole('option', { name: /^Ar, \d+ atoms/ }).click();
    await page.getByRole('switch', { name: 'Periodic cell' }).click();

    await expect.poll(async () => (await canvasPixels(page, canvas, BACKGROUND)).drawn).toBe(0);
    await screen(page, 'viewer-species-hidden');
  });

  test('when the frames request fails, then the server message is shown with a way to try again', async ({ page, context }) => {
    const { bytes } = await lennardJonesExtxyz({ productionSteps: 200 });
    const trajectory = await readyTrajectory(context, 'argon-unlucky.extxyz', bytes);
    let failing = true;
    await page.route('**/api/trajectories/*/frames?**', (route) => (failing
      ? route.fulfill({ status: 503, contentType: 'application/json', body: JSON.stringify({ error: { code: 'storage', message: 'The object store did not answer.' } }) })
      : route.continue()));

    await page.goto(`/trajectories/${trajectory.id}/view`);

    const alert = page.getByRole('alert').filter({ hasText: 'The object store did not answer.' });
    await expect(alert).toBeVisible();
    await screen(page, 'viewer-frames-error');
    failing = false;
    await alert.getByRole('button', { name: 'Try again' }).click();
    await expect(alert).toBeHidden();
    await expect(page.getByRole('region', { name: 'This frame' })).toContainText('Atoms');
    await expect(page.getByRole('img', { name: /3D view of frame 1 of/ })).toBeVisible();
  });

  test('when the trajectory is still being inspected, then the page waits and opens the viewer by itself once it is ready', async ({ page, context }) => {
    const { bytes } = await lennardJonesExtxyz({ productionSteps: 200 });
    const trajectory = await readyTrajectory(context, 'argon-late.extxyz', bytes);
    let stillInspecting = 2;
    await page.route(new RegExp(`/api/trajectories/${trajectory.id}$`), async (route) => {
      if (stillInspecting-- <= 0) return route.continue();
      const response = await route.fetch();
      const { trajectory: stored } = (await response.json()) as { trajectory: object };
      return route.fulfill({ response, json: { trajectory: { ...stored, status: 'inspecting' } } });
    });

    await page.goto(`/trajectories/${trajectory.id}/view`);

    await expect(page.getByRole('status').filter({ hasText: 'still being inspected' })).toBeVisible();
    await screen(page, 'viewer-inspecting');
    await expect(page.getByRole('img', { name: /3D view of frame 1 of/ })).toBeVisible({ timeout: 30_000 });
    expect(stillInspecting).toBeLessThan(0);
  });

  test('when the trajectory could not be read, then the page says why instead of drawing', async ({ page, context }) => {
    const broken = await settledTrajectory(context, 'broken.xyz', Buffer.from('2\nfirst\nAr 0 0 0\nAr 1 1 1\n2\nsecond\nAr 0 0 0\nAr 1 x 1\n'));
    expect(broken.status).toBe('failed');

    await page.goto(`/trajectories/${broken.id}/view`);

    const alert = page.getByRole('alert');
    await expect(alert).toContainText('could not be read');
    await expect(alert).toContainText('frame 2');
    await expect(page.getByRole('img', { name: /3D view/ })).toHaveCount(0);
    await screen(page, 'viewer-failed-trajectory');

    await page.goto('/trajectories/99999999/view');
    await expect(page.getByRole('alert')).toContainText(/not found/i);
  });
});
