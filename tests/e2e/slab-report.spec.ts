import { mkdirSync } from 'node:fs';
import { expect, test } from '@playwright/test';
import { seedReport } from './helpers/report-data.ts';

/**
 * A slab (periodic along x and y only, pbc="T T F"): walkers diffuse in the
 * plane, wrapped at the cell's x and y faces, and stay in layers along z.
 */
function slabExtxyz(): Buffer {
  let seed = 12345;
  const uniform = () => ((seed = (seed * 1103515245 + 12345) % 2147483648) / 2147483648);
  const normal = () => Math.sqrt(-2 * Math.log(uniform() + 1e-12)) * Math.cos(2 * Math.PI * uniform());
  const atoms = 48, frames = 120, L = 16, step = Math.sqrt(2 * 0.5 * 0.05);
  const xy = Array.from({ length: atoms }, () => [uniform() * L, uniform() * L]);
  const blocks: string[] = [];
  for (let f = 0; f < frames; f++) {
    if (f > 0) for (const p of xy) (p[0] += step * normal()), (p[1] += step * normal());
    const lines = xy.map((p, i) => `Ar ${(((p[0]! % L) + L) % L).toFixed(4)} ${(((p[1]! % L) + L) % L).toFixed(4)} ${(4 + (i % 3) * 3.5 + 0.05 * normal()).toFixed(4)}`);
    blocks.push(`${atoms}\nLattice="${L} 0 0 0 ${L} 0 0 0 ${3 * L}" Properties=species:S:1:pos:R:3 pbc="T T F" Time=${(f * 0.05).toFixed(2)}\n${lines.join('\n')}\n`);
  }
  return Buffer.from(blocks.join(''));
}

const SIZES = [{ name: 'desktop', width: 1440, height: 900 }, { name: 'phone', width: 390, height: 844 }] as const;

test('when a slab is analysed, then the MSD card says D is over x and y, the g(r) card says why it was not computed, and the methods say so', async ({ page, context }) => {
  test.setTimeout(240_000);
  const { reportId } = await seedReport(context, 'slab.extxyz', slabExtxyz(), ['thermo', 'msd', 'rdf']);
  await page.goto(`/reports/${reportId}`);
  const cards = page.getByRole('list', { name: 'Headline results' });
  await expect(cards.getByRole('listitem').filter({ hasText: 'D from MSD (Einstein, along x, y)' })).toContainText('Periodic along x, y only');
  await expect(cards.getByRole('listitem').filter({ hasText: 'First-shell coordination' })).toContainText('not computed for a system periodic along x and y only');
  await expect(cards.getByRole('listitem').filter({ hasText: 'Mean temperature' })).toContainText('No density');
  await expect(page.getByText(/only along the periodic directions \(x, y\)/)).toBeVisible();
  mkdirSync('test-results/screens', { recursive: true });
  for (const size of SIZES) {
    await page.setViewportSize({ width: size.width, height: size.height });
    await cards.scrollIntoViewIfNeeded();
    await page.screenshot({ path: `test-results/screens/slab-report-${size.name}.png`, fullPage: true });
    // Nothing of the report itself sticks out of the window (the top bar is the shell's); a failure names what does.
    const wide = await page.evaluate(() => [...document.querySelectorAll('main *')].filter((e) => e.getBoundingClientRect().right > document.documentElement.clientWidth + 0.5)
      .slice(0, 5).map((e) => `${e.tagName.toLowerCase()}.${[...e.classList].join('.')} ${Math.round(e.getBoundingClientRect().right)}px: ${(e.textContent ?? '').trim().slice(0, 60)}`));
    expect(wide, `at ${size.width} px`).toEqual([]);
  }
});
