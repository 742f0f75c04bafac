import type { HeatCapacityPoint, SeriesResults } from '../../../../shared/series-results';
import { GUIDE, line } from '../../reports/charts/chart-option';
import { formatNumber, formatWithError } from '../../reports/number-format';
import { temperatureColours } from '../temperature-scale';
import { errorBars } from './error-bars';
import { barsOf, memberColours, scatter, stateOption, statePoints } from './state-charts';
import { tipHtml } from './point-style';
import type { PlotSeries, SeriesChartSpec } from './series-chart-spec';

/** The caloric curve E(T): energy per atom of every member, its kind named on the axis, latent heat marked. */
export function caloricChart(results: SeriesResults): SeriesChartSpec | null {
  const c = results.caloric;
  const byId = new Map(c.points.map((p) => [p.trajectoryId, p]));
  const pts = statePoints(results, (m) => {
    const p = byId.get(m.trajectoryId);
    return p ? { y: p.energyPerAtomEV, error: p.stdError, lines: [`E = ${formatWithError(p.energyPerAtomEV, p.stdError)} eV/atom`, ...(p.branch ? [`branch: ${p.branch}`] : [])] } : null;
  });
  if (pts.length === 0) return null;
  const kind = c.energyKind === 'kinetic' ? 'kinetic energy' : c.energyKind === 'total' ? 'total energy' : 'energy';
  const s = scatter('E(T)', pts);
  const series: PlotSeries[] = [errorBars('E(T)', barsOf(pts))];
  // Members joined in temperature order within each branch, so a jump stands out.
  for (const branch of ['heating', 'cooling', null] as const) {
    const along = pts.filter((p) => (byId.get(p.member.trajectoryId)?.branch ?? null) === branch);
    if (along.length > 1) {
      series.push(line(branch ? `${branch} branch` : 'members in order of T', along.map((p) => [p.x, p.y] as [number, number]), {
        lineStyle: { color: GUIDE, width: 1, type: branch === 'cooling' ? 'dashed' : 'solid' }, itemStyle: { color: GUIDE }, sampling: undefined, tooltip: { show: false }, z: 0,
      }));
    }
  }
  if (c.latentHeat) {
    const l = c.latentHeat;
    s.markLine = {
      silent: true, symbol: 'none', lineStyle: { color: GUIDE, type: 'dotted' },
      label: { formatter: `latent heat ${formatWithError(l.kJPerMol, l.stdErrorKJPerMol)} kJ/mol at ${formatNumber(l.atK, 4)} K`, color: GUIDE },
      data: [{ xAxis: l.atK }],
    };
  }
  series.push(s);
  return {
    id: 'caloric', title: 'Caloric curve E(T)',
    description: `${kind[0]!.toUpperCase()}${kind.slice(1)} per atom of every member against temperature with ±1σ bars${c.latentHeat ? ', the temperature where the latent heat was read marked' : ''}. ${c.note}`,
    option: { ...stateOption('temperature T (K)', `${kind} per atom (eV)`), series },
    table: { columns: ['member', 'T (K)', `${kind} per atom (eV)`, 'std error (eV)', 'phase', 'branch'], rows: pts.map((p) => [p.member.name, p.x, p.y, p.error, p.member.phase.phase, byId.get(p.member.trajectoryId)?.branch ?? null]) },
  };
}

const SOURCE_WORDS: Record<HeatCapacityPoint['source'], string> = {
  slope: 'slope dE/dT between neighbours',
  fluctuation: 'energy fluctuations of one run',
  'harmonic-vdos': 'harmonic, from the VDOS',
};

/** Cv(T) from every route the series has, k_B per atom, slopes across a transition kept apart. */
export function heatCapacityChart(results: SeriesResults): SeriesChartSpec | null {
  const points = results.heatCapacity.filter((p) => Number.isFinite(p.temperatureK) && Number.isFinite(p.perAtomKB));
  if (points.length === 0) return null;
  const colours = memberColours(results);
  const neutral = temperatureColours([null])[0]!;
  const groups: { name: string; symbol: string; pick: (p: HeatCapacityPoint) => boolean; hollow: boolean }[] = [
    { name: SOURCE_WORDS.slope, symbol: 'circle', pick: (p) => p.source === 'slope' && !p.acrossTransition, hollow: false },
    { name: 'slope across a transition (holds latent heat, not Cv)', symbol: 'circle', pick: (p) => p.source === 'slope' && p.acrossTransition, hollow: true },
    { name: SOURCE_WORDS.fluctuation, symbol: 'rect', pick: (p) => p.source === 'fluctuation', hollow: false },
    { name: SOURCE_WORDS['harmonic-vdos'], symbol: 'triangle', pick: (p) => p.source === 'harmonic-vdos', hollow: false },
  ];
  const series: PlotSeries[] = [];
  for (const g of groups) {
    const mine = points.filter(g.pick);
    if (!mine.length) continue;
    const colourOf = (p: HeatCapacityPoint) => (p.trajectoryIds.length === 1 ? (colours.get(p.trajectoryIds[0]!) ?? neutral) : neutral);
    series.push(errorBars(g.name, mine.flatMap((p) => (p.stdErrorKB !== null && p.stdErrorKB > 0 ? [{ x: p.temperatureK, low: p.perAtomKB - p.stdErrorKB, high: p.perAtomKB + p.stdErrorKB, colour: colourOf(p) }] : []))));
    series.push({
      type: 'scatter', name: g.name, symbol: g.symbol, symbolSize: 10, z: 3,
      data: mine.map((p) => ({
        value: [p.temperatureK, p.perAtomKB],
        itemStyle: g.hollow ? { color: '#ffffff', borderColor: colourOf(p), borderWidth: 2 } : { color: colourOf(p) },
        tip: tipHtml(g.name, [`T = ${formatNumber(p.temperatureK, 4)} K`, `Cv = ${formatWithError(p.perAtomKB, p.stdErrorKB)} k_B per atom (${formatNumber(p.jPerMolK, 4)} J/(mol·K))`, ...(p.energyKind ? [`from ${p.energyKind} energy`] : [])]),
      })),
    });
  }
  const last = series[series.length - 1];
  if (last && last.type === 'scatter') {
    // 3 k_B per atom: the classical harmonic solid (Dulong–Petit law), a reference line only.
    last.markLine = { silent: true, symbol: 'none', lineStyle: { color: GUIDE, type: 'dashed' }, label: { formatter: '3 k_B (Dulong–Petit)', position: 'insideEndTop', color: GUIDE }, data: [{ yAxis: 3 }] };
  }
  return {
    id: 'heat-capacity', title: 'Heat capacity Cv(T)',
    description: 'Heat capacity per atom in units of k_B against temperature: slopes of the caloric curve between neighbouring members, each run’s own energy fluctuations, and the harmonic estimate from the VDOS; the classical 3 k_B line for reference.',
    option: { ...stateOption('temperature T (K)', 'Cv per atom (k_B)'), series },
    table: {
      columns: ['T (K)', 'Cv per atom (k_B)', 'std error (k_B)', 'Cv (J/(mol K))', 'source', 'across a transition', 'energy kind'],
      rows: points.map((p) => [p.temperatureK, p.perAtomKB, p.stdErrorKB, p.jPerMolK, p.source, p.acrossTransition ? 'yes' : 'no', p.energyKind]),
    },
  };
}
