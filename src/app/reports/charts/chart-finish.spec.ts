import { describe, expect, it } from 'vitest';
import type { ReportCurve } from '../../../../shared/report';
import { engineeringLabel, logExtent } from './axis-labels';
import { groupsOf, legendRows, tooltipText, withGroupsHidden } from './chart-finish';
import type { ChartOption, LineSeries, ScatterSeries } from './chart-option';
import { msdChart } from './msd-chart';
import { rdfChart } from './rdf-chart';
import { timeSeriesChart } from './thermo-chart';
import { vdosChart } from './vdos-chart';

const curve = (columns: [string, string, (number | null)[]][]): ReportCurve => ({ columns: columns.map((c) => c[0]), units: columns.map((c) => c[1]), data: columns.map((c) => c[2]) });
const seriesOf = (o: ChartOption) => o.series as (LineSeries | ScatterSeries)[];
type Formatter = (params: unknown) => string;
const tooltipOf = (o: ChartOption) => (o.tooltip as { formatter: Formatter }).formatter;

describe('axis tick labels', () => {
  it('when a tick is tiny or huge, then it is written in engineering notation, never as a long run of zeros', () => {
    expect(engineeringLabel(1e-10)).toBe('100×10⁻¹²');
    expect(engineeringLabel(3e-9)).toBe('3×10⁻⁹');
    expect(engineeringLabel(2.5e7)).toBe('25×10⁶');
    expect(engineeringLabel(-4e-5)).toBe('-40×10⁻⁶');
  });
  it('when a tick is an everyday number, then it is written plainly', () => {
    expect(engineeringLabel(0)).toBe('0');
    expect(engineeringLabel(0.001)).toBe('0.001');
    expect(engineeringLabel(12.5)).toBe('12.5');
    expect(engineeringLabel(99999)).toBe('99999');
  });
});

describe('log axis range', () => {
  it('when data span 0.1 to 1.6, then the axis spans the decades 0.1 to 10 and no further', () => {
    expect(logExtent([0.1, 0.4, 1.6])).toEqual({ min: 0.1, max: 10 });
  });
  it('when data end on a power of ten, then the axis ends there too', () => {
    // 0.000999999999999 is 10⁻³ after round-off, and stays in its own decade.
    expect(logExtent([0.003, 1e-3 * 0.999999999999, 100])).toEqual({ min: 1e-3, max: 100 });
    expect(logExtent([0.02, 100])?.max).toBe(100);
  });
  it('when nothing is positive, then there is no range', () => {
    expect(logExtent([0, -1])).toBeNull();
  });
  it('when the MSD is drawn, then both of its log axes end at the decades holding its data', () => {
    const lags = [0, 0.1, 0.2, 0.4, 0.8, 1.6];
    const o = msdChart(curve([['lag', 'ps', lags], ['MSD all', 'Å²', lags.map((t) => 6 * t)]]), undefined);
    expect(o.xAxis).toMatchObject({ type: 'log', min: 0.1, max: 10 });
    expect(o.yAxis).toMatchObject({ type: 'log', min: 0.1, max: 10 });
  });
});

describe('tooltips', () => {
  it('when the MSD tooltip opens, then lag and MSD carry their units', () => {
    const lags = [0.1, 0.2];
    const o = msdChart(curve([['lag', 'ps', lags], ['MSD all', 'Å²', [0.6, 1.2]], ['MSD Ar', 'Å²', [0.5, 1]]]), undefined);
    const text = tooltipOf(o)([{ seriesName: 'MSD all', value: [0.2, 1.2], marker: '' }, { seriesName: 'MSD Ar', value: [0.2, 1], marker: '' }]);
    expect(text).toBe('lag time = 0.2 ps<br>MSD all: <b>1.2 Å²</b><br>MSD Ar: <b>1 Å²</b>');
  });
  it('when a series lies on the second axis, then it takes that axis unit, and names are escaped', () => {
    const units = new Map([['a<b', 'K'], ['p', 'bar']]);
    expect(tooltipText([{ seriesName: 'a<b', value: [1, 2] }, { seriesName: 'p', value: [1, 3e-7] }], { x: { name: 'time', unit: 'ps' }, y: ['K', 'bar'] }, units))
      .toBe('time = 1 ps<br>a&#60;b: <b>2 K</b><br>p: <b>3 × 10⁻⁷ bar</b>');
  });
});

describe('legends and annotations', () => {
  const thz = [0, 1, 2, 3];
  const vdos = curve([['frequency', 'THz', thz], ['VDOS all', 'modes/THz', [0, 1, 2, 1]]]);
  const cv = { quantum: { perAtomKB: 1, jPerMolK: 1, jPerGK: 1 }, classical: { perAtomKB: 1, jPerMolK: 1, jPerGK: 1 } };
  const vdosSummary = (peaks: { thz: number; cm1: number; meV: number; fwhmCm1: number }[]) => ({
    temperatureK: 80, peaks, modes: 3, cv, entropy: { quantum: { perAtomKB: 1, jPerMolK: 1 }, classical: { perAtomKB: 1, jPerMolK: 1 } }, zeroPoint: { evPerAtom: 0, kJPerMol: 0 },
  });

  it('when the VDOS has no peaks, then there is no "peaks" entry; with peaks there is one, without labels over the curve', () => {
    expect(seriesOf(vdosChart(vdos, vdosSummary([]), 'thz')).map((s) => s.name)).toEqual(['VDOS all']);
    const withPeak = seriesOf(vdosChart(vdos, vdosSummary([{ thz: 2, cm1: 66.7, meV: 8.3, fwhmCm1: 1 }]), 'thz'));
    expect(withPeak.map((s) => s.name)).toEqual(['VDOS all', 'peaks']);
    expect(withPeak[1]!.label).toBeUndefined();
  });

  it('when a mean is drawn, then its value is a legend entry and no text sits on the plot', () => {
    const o = timeSeriesChart(curve([['time', 'ps', [0, 1, 2]], ['temperature', 'K', [85, 88, 86]]]), 'temperature', 'temperature', 'K', { mean: 86.3, stdError: 0.4, blocks: 3 } as never);
    const mean = seriesOf(o).find((s) => String(s.name).startsWith('mean'))! as LineSeries;
    expect(mean.name).toBe('mean 86.30 ± 0.40 K');
    expect(mean.data).toEqual([]);
    expect(mean.markLine!.label).toEqual({ show: false });
    expect((o.legend as { data: string[]; type: string })).toMatchObject({ type: 'plain', data: ['temperature', 'mean 86.30 ± 0.40 K'] });
  });

  it('when many entries would not fit one line on a phone, then the legend is given more rows above the plot instead of pages', () => {
    expect(legendRows(['MSD all'])).toBe(1);
    expect(legendRows(['MSD all', 'MSD Ar', 'MSD Kr', 'MSD Ne', 'slope 1 (diffusive)', 'fit window'])).toBeGreaterThan(1);
  });
});

describe('g(r) with N(r) in its own panel', () => {
  const r = [0, 1, 2, 3, 4];
  const rdf = curve([['r', 'Å', r], ['g all', '1', [0, 0, 2.5, 0.8, 1]], ['N all', 'atoms', [0, 0, 4, 12, 40]], ['g Ar-Kr', '1', [0, 0, 2, 1, 1]], ['N Ar-Kr', 'atoms', [0, 0, 2, 6, 20]], ['g Kr-Kr', '1', [0, 0, 3, 1, 1]], ['N Kr-Kr', 'atoms', [0, 0, 1, 3, 10]]]);
  const summary = { pairs: [{ pair: 'all', firstPeak: { rA: 2, g: 2.5 }, firstMinimum: { rA: 3, g: 0.8, coordination: 12 } }] } as never;

  it('when g(r) is drawn, then N(r) sits on its own axis in its own panel, unclipped, sharing r', () => {
    const o = rdfChart(rdf, summary);
    expect(o.grid).toHaveLength(2);
    const yAxes = o.yAxis as { name: string; gridIndex: number; max?: number }[];
    expect(yAxes.map((a) => [a.name, a.gridIndex])).toEqual([['g(r)', 0], ['N(r)', 1]]);
    expect(yAxes[1]!.max).toBeUndefined();
    const n = seriesOf(o).filter((s) => String(s.name).startsWith('N(r)'));
    expect(n.every((s) => s.xAxisIndex === 1 && s.yAxisIndex === 1)).toBe(true);
    // A pair keeps one colour in both panels; the legend lists only the upper panel's lines and the guide.
    const colour = (name: string) => (seriesOf(o).find((s) => s.name === name)!.itemStyle as { color: string }).color;
    expect(colour('N(r) Ar-Kr')).toBe(colour('g(r) Ar-Kr'));
    expect((o.legend as { data: string[] }).data).toEqual(['g(r) all', 'g(r) Ar-Kr', 'g(r) Kr-Kr', 'first minimum 3 Å, N = 12']);
  });

  it('when a pair is toggled off, then its lines leave both panels and the others keep their colours', () => {
    const o = rdfChart(rdf, summary);
    expect(groupsOf(o)).toEqual(['all', 'Ar-Kr', 'Kr-Kr']);
    const hidden = withGroupsHidden(o, new Set(['all', 'Kr-Kr']));
    expect(seriesOf(hidden).map((s) => s.name)).toEqual(['g(r) Ar-Kr', 'N(r) Ar-Kr', 'first minimum 3 Å, N = 12', 'first minimum 3 Å, N = 12']);
    expect((seriesOf(hidden)[0]!.itemStyle as { color: string }).color).toBe((seriesOf(o)[1]!.itemStyle as { color: string }).color);
    expect((hidden.legend as { data: string[] }).data).toEqual(['g(r) Ar-Kr', 'first minimum 3 Å, N = 12']);
  });
});
