import { describe, expect, it } from 'vitest';
import type { XAXisComponentOption, YAXisComponentOption } from 'echarts';
import { runAnalyses } from '../../../server/analysis/index';
import { decodeCurves, encodeCurves } from '../../../server/services/report-curves';
import { simulateLennardJones } from '../../../server/simulate/lennard-jones';
import type { ReportDto } from '../../../shared/report';
import { reportChartSpecs } from './charts/report-charts-spec';
import { echarts } from './echarts-setup';
import { figureOption, FIGURE_SIZE, svgFigure, type FigureRenderer } from './figure-export';

/** A real report of a small Lennard-Jones liquid: every curve the engine draws without an interaction model. */
function liquidReport(): ReportDto {
  const { trajectory } = simulateLennardJones({
    cellsPerSide: 3, reducedDensity: 0.8442, temperatureK: 86.5, meltTemperatureK: 250, meltSteps: 100,
    equilibrationSteps: 100, productionSteps: 400, sampleEvery: 5, seed: 3,
  });
  const analyses = ['thermo', 'msd', 'vacf', 'vdos', 'rdf', 'sq', 'lindemann', 'ngp'] as const;
  const run = runAnalyses(trajectory, analyses, {});
  const stored = decodeCurves(encodeCurves(run.curves));
  const curves = Object.fromEntries(Object.entries(stored).map(([k, c]) => [k, { columns: c.columns, units: c.units, data: c.data.map((col) => Array.from(col, (v) => (Number.isFinite(v) ? v : null))) }]));
  return {
    id: 12, projectId: 1, trajectoryId: 1, trajectoryName: 'larkspur-argon.extxyz', runId: 1, title: 'Argon at 86.5 K', notes: '', analyses: [...analyses],
    params: {}, summary: run.summary, methods: run.methods as Record<string, unknown>, engineVersion: run.engineVersion, inputSha256: null,
    createdAt: '2026-03-04T10:00:00.000Z', curves,
  } as ReportDto;
}

const renderer = echarts as unknown as FigureRenderer;
const axes = <T>(a: T | T[] | undefined): T[] => (a === undefined ? [] : Array.isArray(a) ? a : [a]);
const escapeXml = (s: string) => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');

describe('figures for a paper', () => {
  const report = liquidReport();
  const specs = reportChartSpecs(report, { diffusion: 'e9M2PerS', frequency: 'cm1' });

  it('when the report is drawn, then there is a chart for each curve', () => {
    expect(specs.map((s) => s.id).length).toBeGreaterThanOrEqual(6);
  });

  it('when any chart is exported as SVG, then it is a standalone SVG carrying every axis title, and each physical x-axis names its unit', () => {
    for (const spec of specs) {
      const svg = svgFigure(renderer, { option: spec.option, caption: '', ...FIGURE_SIZE });
      expect(svg, spec.id).toMatch(/^<svg[^>]*xmlns="http:\/\/www\.w3\.org\/2000\/svg"/);
      expect(svg, spec.id).toContain(`width="${FIGURE_SIZE.width}"`);
      const names = [...axes(spec.option.xAxis as XAXisComponentOption | XAXisComponentOption[]), ...axes(spec.option.yAxis as YAXisComponentOption | YAXisComponentOption[])]
        .map((a) => a.name).filter((n): n is string => typeof n === 'string');
      expect(names.length, spec.id).toBeGreaterThanOrEqual(2);
      for (const name of names) expect(svg, `${spec.id}: ${name}`).toContain(escapeXml(name));
      // A physical x quantity carries its unit; a count such as the atom index has none.
      for (const x of axes(spec.option.xAxis as XAXisComponentOption | XAXisComponentOption[])) expect(x.name, spec.id).toMatch(/\(.+\)|index$/);
    }
  });

  it('when a caption is given, then it is set under the plot, wrapped, with the plot raised to make room; without one nothing is added', () => {
    const msd = specs.find((s) => s.id === 'msd')!;
    const caption = 'Figure 2. Mean-square displacement of liquid argon at 86.5 K (Larkspur Materials Lab), with the Einstein fit window shaded.';
    const svg = svgFigure(renderer, { option: msd.option, caption, ...FIGURE_SIZE });
    expect(svg).toContain('Figure 2. Mean-square displacement');
    const withCaption = figureOption(msd.option, caption, FIGURE_SIZE.width);
    const without = figureOption(msd.option, '  ', FIGURE_SIZE.width);
    expect((withCaption.grid as { bottom: number }).bottom).toBeGreaterThan((without.grid as { bottom: number }).bottom);
    expect(without).not.toHaveProperty('title');
    expect(without).not.toHaveProperty('tooltip');
    expect(without.backgroundColor).toBe('#ffffff');
  });
});

describe('exporting a chart of stacked panels', () => {
  it('when g(r) and N(r) are exported with a caption, then both panels stay and the lower one makes room for it', async () => {
    const { figureOption } = await import('./figure-export');
    const option = { grid: [{ top: 48, bottom: '46%' }, { top: '62%', bottom: 48 }] } as never;
    const figure = figureOption(option, 'Radial distribution of the Larkspur mixture at 86 K.', 800);
    const grids = figure.grid as { top?: unknown; bottom?: unknown }[];
    expect(grids).toHaveLength(2);
    expect(grids[0]).toEqual({ top: 48, bottom: '46%' });
    expect(grids[1]!.bottom).toBeGreaterThan(48);
  });
});
