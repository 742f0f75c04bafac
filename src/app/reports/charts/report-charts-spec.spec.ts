import { describe, expect, it } from 'vitest';
import type { ReportCurve, ReportDto } from '../../../../shared/report';
import type { LineSeries, ScatterSeries } from './chart-option';
import { reportChartSpecs, type ChartSpec, type ChartUnits } from './report-charts-spec';

const D = (a2PerPs: number) => ({ a2PerPs, e9M2PerS: a2PerPs * 10, cm2PerS: a2PerPs * 1e-4 });
const lags = [0, 0.1, 0.2, 0.4, 0.8, 1.6];
const curve = (columns: [string, string, (number | null)[]][]): ReportCurve => ({ columns: columns.map((c) => c[0]), units: columns.map((c) => c[1]), data: columns.map((c) => c[2]) });
const thz = [0, 1, 2, 3, 4];

const report: ReportDto = {
  id: 1, projectId: 1, trajectoryId: 1, trajectoryName: 't.xyz', runId: 1, title: 't', notes: '', analyses: ['msd', 'vacf', 'vdos'], params: {},
  summary: {
    msd: { dimensions: 3, groups: [{ label: 'all', atoms: 4, regime: 'diffusive', d: D(0.1), dStdError: D(0.01), uncertaintyMethod: 'atom-blocks', slopeExponent: 1, fitWindowPs: { start: 0.2, end: 0.8, source: 'auto' }, plateauA2: null }] },
    vacf: { velocitySource: 'stored-velocities', groups: [{ label: 'all', atoms: 4, dGreenKubo: D(0.1), spread: D(0.01), converged: true, plateauWindowPs: { start: 0.4, end: 1.6, source: 'auto' } }] },
    vdos: {
      temperatureK: 80, peaks: [{ thz: 2, cm1: 66.71, meV: 8.27, fwhmCm1: 10 }], modes: 9,
      cv: { quantum: { perAtomKB: 2.9, jPerMolK: 24, jPerGK: 0.6 }, classical: { perAtomKB: 3, jPerMolK: 25, jPerGK: 0.62 } },
      entropy: { quantum: { perAtomKB: 1, jPerMolK: 8 }, classical: { perAtomKB: 1, jPerMolK: 8 } }, zeroPoint: { evPerAtom: 0.001, kJPerMol: 0.1 },
    },
  },
  methods: {}, engineVersion: '0.1.0', inputSha256: null, createdAt: '2026-01-01T00:00:00Z',
  curves: {
    msd: curve([['lag', 'ps', lags], ['MSD all', 'Å²', lags.map((t) => 0.6 * t)]]),
    vacf: curve([['lag', 'ps', lags], ['VACF all', 'Å²/ps²', lags.map(() => 1)], ['normalised VACF all', '1', lags.map((t) => Math.exp(-t))], ['running D all', 'Å²/ps', lags.map(() => 0.1)]]),
    vdos: curve([['frequency', 'THz', thz], ['wavenumber', 'cm⁻¹', thz.map((f) => f * 33.356)], ['energy', 'meV', thz.map((f) => f * 4.1357)], ['VDOS all', 'modes/THz', [0, 1, 4, 1, 0]]]),
  },
};

const spec = (id: string, units: ChartUnits = { diffusion: 'a2PerPs', frequency: 'thz' }): ChartSpec =>
  reportChartSpecs(report, units).find((s) => s.id === id)!;
const seriesOf = (s: ChartSpec) => s.option.series as (LineSeries | ScatterSeries)[];
const area = (data: [number, number][]) => data.slice(1).reduce((sum, [x, y], i) => sum + ((y + data[i]![1]) / 2) * (x - data[i]![0]), 0);

describe('report chart specs', () => {
  it('when a report has only some curves, then only their charts are listed, each naming its CSV curve', () => {
    expect(reportChartSpecs(report, { diffusion: 'a2PerPs', frequency: 'thz' }).map((s) => [s.id, s.curve])).toEqual([['msd', 'msd'], ['vacf', 'vacf'], ['vdos', 'vdos']]);
  });

  it('when the MSD is drawn, then both axes are logarithmic, lag 0 is left out, the fit window is shaded and the guide has slope 1', () => {
    const s = spec('msd');
    expect(s.option.xAxis).toMatchObject({ type: 'log' });
    expect(s.option.yAxis).toMatchObject({ type: 'log' });
    const [msd, guide, window] = seriesOf(s) as LineSeries[];
    expect((msd!.data as [number, number][])[0]).toEqual([0.1, 0.06]);
    expect(window!.name).toBe('fit window');
    expect(window!.markArea!.data).toEqual([[{ xAxis: 0.2 }, { xAxis: 0.8 }]]);
    const [[x0, y0], [x1, y1]] = guide!.data as [number, number][];
    expect(Math.log(y1! / y0!) / Math.log(x1! / x0!)).toBeCloseTo(1, 12);
  });

  it('when D is shown in 10⁻⁹ m²/s, then the running Green–Kubo curve is scaled by ten and its axis says so', () => {
    const s = spec('vacf', { diffusion: 'e9M2PerS', frequency: 'thz' });
    const running = seriesOf(s).find((x) => x.name === 'running D all') as LineSeries;
    expect((running.data as [number, number][])[0]![1]).toBeCloseTo(1, 12);
    expect((s.option.yAxis as { name: string }[])[1]!.name).toBe('running D (10⁻⁹ m²/s)');
  });

  it('when the VDOS axis is switched to cm⁻¹, then x is the wavenumber, the area still counts the same modes, and the peak sits at its wavenumber', () => {
    const inThz = seriesOf(spec('vdos'));
    const inCm = seriesOf(spec('vdos', { diffusion: 'a2PerPs', frequency: 'cm1' }));
    const thzLine = inThz[0]!.data as [number, number][];
    const cmLine = inCm[0]!.data as [number, number][];
    expect(cmLine[2]![0]).toBeCloseTo(66.712, 3);
    expect(area(cmLine)).toBeCloseTo(area(thzLine), 10);
    expect((inCm[1]!.data as [number, number][])[0]).toEqual([66.71, cmLine[2]![1]]);
  });
});

describe('g(r) chart', () => {
  const r = [0, 1, 2, 3];
  const withRdf = (columns: [string, string, (number | null)[]][]): ReportDto => ({ ...report, summary: {}, curves: { rdf: curve([['r', 'Å', r], ...columns]) } });
  const names = (dto: ReportDto) => seriesOf(reportChartSpecs(dto, { diffusion: 'a2PerPs', frequency: 'thz' })[0]!).map((s) => s.name);

  it('when there is one species, then its pair is not drawn again on top of "all"', () => {
    expect(names(withRdf([['g all', '1', [0, 0, 2, 1]], ['N all', 'atoms', [0, 0, 4, 12]], ['g Ar-Ar', '1', [0, 0, 2, 1]], ['N Ar-Ar', 'atoms', [0, 0, 4, 12]]])))
      .toEqual(['g(r) all', 'N(r) all']);
  });

  it('when there are several species, then every pair is drawn beside "all"', () => {
    const cols = ['all', 'Na-Na', 'Na-Cl', 'Cl-Cl'].flatMap((p): [string, string, number[]][] => [[`g ${p}`, '1', [0, 1, 2, 1]], [`N ${p}`, 'atoms', [0, 1, 2, 3]]]);
    expect(names(withRdf(cols))).toEqual(['g(r) all', 'g(r) Na-Na', 'g(r) Na-Cl', 'g(r) Cl-Cl', 'N(r) all', 'N(r) Na-Na', 'N(r) Na-Cl', 'N(r) Cl-Cl']);
  });
});

describe('α₂ chart', () => {
  it('when a mixture was analysed, then each species has its own α₂ line with its own peak marked, and an older single column still draws', async () => {
    const { ngpChart } = await import('./melting-charts');
    const perSpecies = ngpChart(curve([['lag', 'ps', lags], ['alpha2 Ar', '1', lags.map(() => 0.01)], ['MSD Ar', 'Å²', lags], ['alpha2 Ne', '1', lags.map(() => -0.01)], ['MSD Ne', 'Å²', lags]]), {
      peakLagPs: null, peakAlpha2: null, groups: [{ label: 'Ar', atoms: 2, peakLagPs: 0.4, peakAlpha2: 0.01 }, { label: 'Ne', atoms: 2, peakLagPs: 0.8, peakAlpha2: -0.01 }],
    });
    const lines = perSpecies.series as LineSeries[];
    expect(lines.map((s) => s.name)).toEqual(['α₂ Ar', 'Ar peak at 0.4 ps', 'α₂ Ne', 'Ne peak at 0.8 ps']);
    expect(lines.filter((s) => s.markLine).map((s) => (s.markLine?.data as { xAxis: number }[])[0]!.xAxis)).toEqual([0.4, 0.8]);
    // Each peak line is its species' colour, so a species toggle hides both.
    expect(lines[1]!.lineStyle!.color).toBe(lines[0]!.lineStyle!.color);
    const old = ngpChart(curve([['lag', 'ps', lags], ['alpha2', '1', lags.map(() => 0.02)]]), { peakLagPs: 0.2, peakAlpha2: 0.02 });
    expect((old.series as LineSeries[]).map((s) => s.name)).toEqual(['α₂(t)', 'peak at 0.2 ps']);
    expect(((old.series as LineSeries[])[1]!.markLine?.data as { xAxis: number }[])[0]!.xAxis).toBe(0.2);
  });
});
