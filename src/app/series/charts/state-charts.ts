import type { ScatterSeriesOption } from 'echarts/charts';
import type { SeriesMemberResult, SeriesResults } from '../../../../shared/series-results';
import { baseOption, GUIDE, line, xAxis, yAxis } from '../../reports/charts/chart-option';
import { formatNumber, formatWithError } from '../../reports/number-format';
import { diffusionLabel, type DiffusionUnit } from '../../reports/report-units';
import { temperatureColours } from '../temperature-scale';
import { errorBars, type ErrorBar } from './error-bars';
import { PHASE_SYMBOL, tipHtml, tipOf } from './point-style';
import type { PlotSeries, SeriesChartSpec } from './series-chart-spec';

/** A member's reading at its temperature, with its error and the words its tooltip shows. */
export interface StatePoint {
  member: SeriesMemberResult;
  x: number;
  y: number;
  error: number | null;
  colour: string;
  lines: string[];
}

/** Each member with a temperature, keyed to its colour on the cold-to-hot scale. */
export function memberColours(results: SeriesResults): Map<number, string> {
  const colours = temperatureColours(results.members.map((m) => m.temperatureK));
  return new Map(results.members.map((m, i) => [m.trajectoryId, colours[i]!]));
}

/** Points drawn filled when they count in fits, hollow when the member is excluded. */
export function scatter(name: string, pts: readonly StatePoint[]): ScatterSeriesOption {
  return {
    type: 'scatter', name, symbolSize: 10, z: 3,
    data: pts.map((p) => ({
      value: [p.x, p.y],
      symbol: PHASE_SYMBOL[p.member.phase.phase],
      itemStyle: p.member.excludedFromFits ? { color: '#ffffff', borderColor: p.colour, borderWidth: 2 } : { color: p.colour },
      tip: tipHtml(p.member.name, [...p.lines, `phase: ${p.member.phase.phase}`, ...(p.member.excludedFromFits ? ['excluded from fits'] : [])]),
    })),
  };
}

export function barsOf(pts: readonly StatePoint[], transform: (y: number, e: number) => [number, number] = (y, e) => [y - e, y + e]): ErrorBar[] {
  return pts.flatMap((p) => {
    if (p.error === null || !(p.error > 0)) return [];
    const [low, high] = transform(p.y, p.error);
    return [{ x: p.x, low, high, colour: p.colour }];
  });
}

/** Options every per-temperature chart shares: item tooltips from the points' own text. */
export function stateOption(xName: string, yName: string, logY = false) {
  return {
    ...baseOption(),
    tooltip: { trigger: 'item' as const, formatter: tipOf },
    xAxis: xAxis(xName),
    yAxis: yAxis(yName, logY ? 'log' : 'value', { nameGap: 52 }),
  };
}

const K = (t: number) => `${formatNumber(t, 4)} K`;

/** Members with a temperature and a reading, in temperature order. */
export function statePoints(results: SeriesResults, read: (m: SeriesMemberResult) => { y: number; error: number | null; lines: string[] } | null): StatePoint[] {
  const colours = memberColours(results);
  return results.members
    .filter((m) => m.temperatureK !== null)
    .flatMap((m) => {
      const r = read(m);
      return r && Number.isFinite(r.y) ? [{ member: m, x: m.temperatureK!, y: r.y, error: r.error, colour: colours.get(m.trajectoryId)!, lines: [`T = ${K(m.temperatureK!)} (${m.temperatureSource})`, ...r.lines] }] : [];
    })
    .sort((a, b) => a.x - b.x);
}

/** D against T with ±1σ bars, in the unit chosen on the page. */
export function diffusionChart(results: SeriesResults, unit: DiffusionUnit): SeriesChartSpec | null {
  const label = diffusionLabel(unit);
  const pts = statePoints(results, (m) => (m.d ? { y: m.d[unit], error: m.dStdError?.[unit] ?? null, lines: [`D = ${formatWithError(m.d[unit], m.dStdError?.[unit])} ${label}`] } : null));
  if (pts.length === 0) return null;
  return {
    id: 'diffusion', title: 'Diffusion coefficient D(T)', description: `D from the MSD of every member against temperature, in ${label}, with ±1σ error bars; marker shape shows the phase.`,
    option: { ...stateOption('temperature T (K)', `D (${label})`), series: [errorBars('D', barsOf(pts)), scatter('D', pts)] },
    table: { columns: ['member', 'T (K)', `D (${label})`, `D std error (${label})`, 'phase', 'excluded from fits'], rows: pts.map((p) => [p.member.name, p.x, p.y, p.error, p.member.phase.phase, p.member.excludedFromFits ? 'yes' : 'no']) },
  };
}

/** Gas constant, J/(mol·K) (CODATA 2018, exact). */
const R = 8.314462618;

/**
 * The Arrhenius plot: D on a log axis against 1000/T, so ln D = ln D₀ − E_a/(RT)
 * is a straight line; the fitted line over the fitted range, bars ±1σ of ln D.
 */
export function arrheniusChart(results: SeriesResults, unit: DiffusionUnit): SeriesChartSpec | null {
  const fit = results.arrhenius;
  const label = diffusionLabel(unit);
  const pts = statePoints(results, (m) => (m.d && m.d[unit] > 0 ? { y: m.d[unit], error: m.dStdError?.[unit] ?? null, lines: [`D = ${formatWithError(m.d[unit], m.dStdError?.[unit])} ${label}`] } : null))
    .map((p) => ({ ...p, x: 1000 / p.x }));
  if (pts.length === 0) return null;
  const fitted = new Set(fit.points.map((p) => p.trajectoryId));
  const inFit = pts.filter((p) => fitted.has(p.member.trajectoryId));
  const outOfFit = pts.filter((p) => !fitted.has(p.member.trajectoryId)).map((p) => ({ ...p, member: { ...p.member, excludedFromFits: true } }));
  // Bars of ln D: σ(ln D) = σ_D / D, drawn as D·e^{±σ/D} on the log axis.
  const lnBars = (y: number, e: number): [number, number] => [y * Math.exp(-e / y), y * Math.exp(e / y)];
  const series: PlotSeries[] = [errorBars('members', barsOf(pts, lnBars)), scatter('fitted', inFit)];
  if (outOfFit.length) series.push(scatter('not fitted', outOfFit));
  if (fit.status === 'fitted' && fit.activationEnergy && fit.d0 && fit.rangeK) {
    const ea = fit.activationEnergy.kJPerMol * 1000, d0 = fit.d0[unit];
    const xs = [1000 / fit.rangeK.max, 1000 / fit.rangeK.min];
    series.push(line(`fit: E_a = ${formatWithError(fit.activationEnergy.kJPerMol, fit.activationEnergyStdError?.kJPerMol)} kJ/mol`,
      xs.map((x) => [x, d0 * Math.exp((-ea * x) / 1000 / R)] as [number, number]), { lineStyle: { color: GUIDE, type: 'dashed', width: 1.4 }, itemStyle: { color: GUIDE }, sampling: undefined, tooltip: { show: false } }));
  }
  return {
    id: 'arrhenius', title: 'Arrhenius plot: ln D against 1/T',
    description: `D of every member on a logarithmic axis against 1000/T, the weighted Arrhenius fit as a dashed line over the fitted range; bars are ±1σ of ln D.`,
    option: { ...stateOption('1000/T (K⁻¹)', `D (${label}), log scale`, true), series },
    table: { columns: ['member', 'T (K)', '1000/T (1/K)', `D (${label})`, `D std error (${label})`, 'in fit'], rows: pts.map((p) => [p.member.name, 1000 / p.x, p.x, p.y, p.error, fitted.has(p.member.trajectoryId) ? 'yes' : 'no']) },
  };
}

/** The Lindemann ratio against T, with the two thresholds the phase names use. */
export function lindemannChart(results: SeriesResults): SeriesChartSpec | null {
  const pts = statePoints(results, (m) => (m.lindemannRatio !== null ? { y: m.lindemannRatio, error: null, lines: [`Lindemann ratio = ${formatNumber(m.lindemannRatio, 3)}`] } : null));
  if (pts.length === 0) return null;
  const s = scatter('Lindemann ratio', pts);
  const { lindemannSolidBelow: solid, lindemannFluidAbove: fluid } = results.criteria;
  s.markLine = {
    silent: true, symbol: 'none', lineStyle: { color: GUIDE, type: 'dashed' },
    data: [{ yAxis: solid, label: { formatter: `solid below ${solid}`, position: 'insideEndBottom', color: GUIDE } }, { yAxis: fluid, label: { formatter: `fluid above ${fluid}`, position: 'insideEndTop', color: GUIDE } }],
  };
  return {
    id: 'lindemann', title: 'Lindemann ratio against temperature', description: `Each member's Lindemann ratio √⟨u²⟩/r_nn against temperature, with the solid (${solid}) and fluid (${fluid}) thresholds as dashed lines.`,
    option: { ...stateOption('temperature T (K)', 'Lindemann ratio'), series: [s] },
    table: { columns: ['member', 'T (K)', 'Lindemann ratio', 'phase'], rows: pts.map((p) => [p.member.name, p.x, p.y, p.member.phase.phase]) },
  };
}

/** Mass density against T with ±1σ bars. */
export function densityChart(results: SeriesResults): SeriesChartSpec | null {
  const pts = statePoints(results, (m) => (m.densityGPerCm3 ? { y: m.densityGPerCm3.mean, error: m.densityGPerCm3.stdError, lines: [`ρ = ${formatWithError(m.densityGPerCm3.mean, m.densityGPerCm3.stdError)} g/cm³`] } : null));
  if (pts.length === 0) return null;
  return {
    id: 'density', title: 'Density against temperature', description: 'Mass density of every member against temperature, with ±1σ error bars.',
    option: { ...stateOption('temperature T (K)', 'density ρ (g/cm³)'), series: [errorBars('density', barsOf(pts)), scatter('density', pts)] },
    table: { columns: ['member', 'T (K)', 'density (g/cm³)', 'density std error (g/cm³)', 'phase'], rows: pts.map((p) => [p.member.name, p.x, p.y, p.error, p.member.phase.phase]) },
  };
}
