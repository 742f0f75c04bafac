import { mkdirSync, readFileSync } from 'node:fs';
import { strFromU8, unzipSync } from 'fflate';
import { expect, test, type Page } from '@playwright/test';
import { lennardJonesExtxyz } from '../support/fixtures.ts';
import { seedReport } from './helpers/report-data.ts';

const SCREENS = 'test-results/screens';

async function screens(page: Page, name: string): Promise<void> {
  mkdirSync(SCREENS, { recursive: true });
  for (const [label, width, height] of [['1440', 1440, 900], ['390', 390, 844]] as const) {
    await page.setViewportSize({ width, height });
    await page.screenshot({ path: `${SCREENS}/${name}-${label}.png`, fullPage: true });
  }
  await page.setViewportSize({ width: 1440, height: 900 });
}

async function downloaded(page: Page, click: () => Promise<void>): Promise<{ name: string; bytes: Buffer }> {
  const downloading = page.waitForEvent('download');
  await click();
  const download = await downloading;
  return { name: download.suggestedFilename(), bytes: readFileSync((await download.path())!) };
}

test.describe('exports for a paper', () => {
  test.use({ viewport: { width: 1440, height: 900 } });

  test('when a reader exports a report, then each chart comes as SVG or PNG with axis titles and the caption, and one zip holds every file with a citation', async ({ page, context }) => {
    test.setTimeout(300_000);
    const { bytes } = await lennardJonesExtxyz({ productionSteps: 800 });
    const { reportId } = await seedReport(context, 'larkspur-argon-86K.extxyz', bytes, ['thermo', 'msd', 'rdf']);
    await page.goto(`/reports/${reportId}`);
    const chart = page.getByRole('figure', { name: 'Mean-square displacement' });
    await expect(chart.getByRole('img', { name: /MSD against lag time/ })).toBeVisible();

    const caption = 'Figure 3. Mean-square displacement of liquid argon at 86.5 K; the shaded band is the Einstein fit window.';
    await page.getByRole('button', { name: 'Caption for Mean-square displacement' }).click();
    await chart.getByRole('textbox', { name: 'Caption for the exported figure' }).fill(caption);
    await screens(page, 'report-exports');

    const svg = await downloaded(page, () => page.getByRole('button', { name: 'Download Mean-square displacement as SVG' }).click());
    expect(svg.name).toBe(`ergodic-report-${reportId}-msd.svg`);
    const svgText = svg.bytes.toString('utf8');
    expect(svgText).toMatch(/^<svg[^>]*xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
    expect(svgText).toContain('lag time t (ps)');
    expect(svgText).toContain('MSD (Å²)');
    expect(svgText).toContain('Figure 3. Mean-square displacement');

    const png = await downloaded(page, () => page.getByRole('button', { name: 'Download Mean-square displacement as PNG' }).click());
    expect(png.name).toBe(`ergodic-report-${reportId}-msd.png`);
    expect(png.bytes.subarray(1, 4).toString('ascii')).toBe('PNG');
    // 800 × 500 CSS pixels drawn at twice the density.
    expect(png.bytes.readUInt32BE(16)).toBe(1600);
    expect(png.bytes.readUInt32BE(20)).toBe(1000);

    const citation = page.getByRole('region', { name: 'How to cite' });
    await expect(citation).toContainText(new RegExp(`^How to cite.*Ergodic \\S+, analysis report ${reportId}, “`));
    await expect(citation).toContainText(`(Ergodic `);

    const zip = await downloaded(page, () => page.getByRole('button', { name: /^Download everything/ }).click());
    expect(zip.name).toBe(`ergodic-report-${reportId}.zip`);
    const files = unzipSync(new Uint8Array(zip.bytes));
    const folder = `ergodic-report-${reportId}`;
    const curves = Object.keys(((await (await context.request.get(`/api/reports/${reportId}`)).json()) as { report: { curves: Record<string, unknown> } }).report.curves);
    expect(Object.keys(files).sort()).toEqual([
      `${folder}/README.txt`, `${folder}/citation.txt`, ...curves.map((c) => `${folder}/curves/${c}.csv`).sort(), `${folder}/methods.txt`, `${folder}/report.json`,
    ].sort());
    expect(strFromU8(files[`${folder}/methods.txt`]!)).toContain('Einstein relation');
    expect(strFromU8(files[`${folder}/methods.txt`]!)).toContain('A simulation is a model');
    expect(strFromU8(files[`${folder}/citation.txt`]!)).toContain(`analysis report ${reportId}`);
    expect(strFromU8(files[`${folder}/curves/msd.csv`]!).split('\n')[0]).toBe('lag (ps),MSD all (Å²)');
    expect(JSON.parse(strFromU8(files[`${folder}/report.json`]!))).toBeTruthy();
  });
});
