/**
 * Frame viewer benchmark: time to the first frame on screen, playback rate
 * and orbit redraw rate at 50 000 atoms, in headless Chromium, against the
 * same measurements for a 500-atom system in the same run. Headless Chromium
 * draws WebGL with SwiftShader (a software renderer on the CPU), so these are
 * lower bounds for any machine with a GPU.
 */
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { chromium, request, type Browser, type Page } from '@playwright/test';
import { loadConfig } from '../server/config.ts';
import { startServer } from '../server/main.ts';
import { buildAppIfNeeded } from '../scripts/build-app.ts';
import { startTestStack } from '../scripts/services/test-stack.ts';
import { freePort } from '../scripts/services/wait-for-port.ts';
import { syntheticSystemExtxyz } from '../tests/support/synthetic-system.ts';
import type { BenchRow } from './bench-row.ts';
import { uploadForViewer, type ViewerUpload } from './viewer-upload.ts';

const LARGE_ATOMS = 50_000;
const SMALL_ATOMS = 500;
const FRAMES = 30;
const ORBIT_SECONDS = 5;
const FIRST_FRAME_MARK = 'ergodic:viewer-first-frame';

interface ViewerTimes {
  firstFrameS: number;
  firstRequestS: number;
  playbackFps: number;
  orbitDrawsPerS: number;
}

/** Records when each draw starts (one WebGL clear per draw), without touching the app's code. */
const RECORD_DRAWS = `(() => {
  const clear = WebGL2RenderingContext.prototype.clear;
  window.__ergodicDraws = [];
  WebGL2RenderingContext.prototype.clear = function (mask) { window.__ergodicDraws.push(performance.now()); return clear.call(this, mask); };
})();`;

const drawCount = async (page: Page) => (await page.evaluate('window.__ergodicDraws.length')) as number;

/** Draws per second from the n-th recorded draw on. */
async function drawRate(page: Page, from: number): Promise<number> {
  const times = (await page.evaluate(`window.__ergodicDraws.slice(${from})`)) as number[];
  return times.length < 2 ? 0 : ((times.length - 1) * 1000) / (times.at(-1)! - times[0]!);
}

async function firstFrame(page: Page): Promise<{ firstFrameS: number; firstRequestS: number }> {
  await page.waitForFunction((mark) => performance.getEntriesByName(mark).length > 0, FIRST_FRAME_MARK, { timeout: 120_000 });
  return page.evaluate((mark) => {
    const frames = performance.getEntriesByType('resource').find((e) => e.name.includes('/frames?'));
    return { firstFrameS: performance.getEntriesByName(mark)[0]!.startTime / 1000, firstRequestS: (frames?.duration ?? NaN) / 1000 };
  }, FIRST_FRAME_MARK);
}

/** Plays every frame at the top speed, once all are cached: the drawing is timed, not the network. */
async function playbackRate(page: Page): Promise<number> {
  await page.waitForLoadState('networkidle');
  await page.getByRole('combobox', { name: /Playback speed/ }).click();
  await page.getByRole('option', { name: '60 frames/s' }).click();
  const from = await drawCount(page);
  await page.getByRole('button', { name: 'Play', exact: true }).click();
  // Playback stops by itself on the last frame.
  await page.getByRole('button', { name: 'Play', exact: true }).waitFor({ timeout: 120_000 });
  return drawRate(page, from);
}

/** Drags across the canvas, as a user turning the view, and counts the redraws that follow. */
async function orbitRate(page: Page): Promise<number> {
  const box = (await page.getByRole('img', { name: /3D view/ }).boundingBox())!;
  const cx = box.x + box.width / 2;
  const cy = box.y + box.height / 2;
  const from = await drawCount(page);
  const start = Date.now();
  await page.mouse.move(cx, cy);
  await page.mouse.down();
  for (let step = 0; Date.now() - start < ORBIT_SECONDS * 1000; step++) {
    await page.mouse.move(cx + 150 * Math.sin(step / 10), cy + 60 * Math.cos(step / 13));
  }
  await page.mouse.up();
  return drawRate(page, from);
}

async function measure(browser: Browser, baseURL: string, upload: ViewerUpload): Promise<ViewerTimes> {
  const context = await browser.newContext({ baseURL, viewport: { width: 1280, height: 800 }, storageState: upload.state });
  const page = await context.newPage();
  await page.addInitScript(RECORD_DRAWS);
  try {
    await page.goto(`/trajectories/${upload.trajectoryId}/view`);
    const first = await firstFrame(page);
    return { ...first, playbackFps: await playbackRate(page), orbitDrawsPerS: await orbitRate(page) };
  } finally {
    await context.close();
  }
}

export async function benchViewer(): Promise<BenchRow[]> {
  const root = fileURLToPath(new URL('..', import.meta.url));
  buildAppIfNeeded(root, (m) => console.log(`[bench] ${m}`));
  const stack = await startTestStack();
  const server = await startServer(loadConfig({ ...process.env, ...stack.env, PORT: String(await freePort()), STATIC_DIR: join(root, 'dist/ergodic/browser') }));
  const browser = await chromium.launch({ executablePath: '/usr/bin/chromium', args: ['--no-sandbox', '--disable-background-networking', '--no-first-run'] });
  try {
    const api = await request.newContext({ baseURL: server.url });
    const large = await uploadForViewer(api, 'bench-50k.extxyz', syntheticSystemExtxyz(LARGE_ATOMS, FRAMES));
    const small = await uploadForViewer(api, 'bench-500.extxyz', syntheticSystemExtxyz(SMALL_ATOMS, FRAMES));
    await api.dispose();
    const ref = await measure(browser, server.url, small);
    const big = await measure(browser, server.url, large);
    const env = 'headless Chromium, SwiftShader software WebGL';
    return [
      {
        name: 'viewer 50k atoms: first frame on screen', seconds: big.firstFrameS, reference: `${SMALL_ATOMS} atoms`, ratio: big.firstFrameS / ref.firstFrameS,
        note: `from navigation start; its first frames request took ${big.firstRequestS.toFixed(2)} s`,
      },
      {
        name: 'viewer 50k atoms: playback, s per frame', seconds: 1 / big.playbackFps, reference: `${SMALL_ATOMS} atoms`, ratio: ref.playbackFps / big.playbackFps,
        note: `${big.playbackFps.toFixed(1)} frames/s with 60 asked, frames cached (${SMALL_ATOMS} atoms: ${ref.playbackFps.toFixed(1)}); ${env}`,
      },
      {
        name: 'viewer 50k atoms: orbit, s per redraw', seconds: 1 / big.orbitDrawsPerS, reference: `${SMALL_ATOMS} atoms`, ratio: ref.orbitDrawsPerS / big.orbitDrawsPerS,
        note: `${big.orbitDrawsPerS.toFixed(1)} redraws/s while dragging (${SMALL_ATOMS} atoms: ${ref.orbitDrawsPerS.toFixed(1)}); ${env}`,
      },
    ];
  } finally {
    await browser.close();
    await server.stop();
    await stack.stop();
  }
}
