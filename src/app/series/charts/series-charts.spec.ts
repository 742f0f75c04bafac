import { describe, expect, it } from 'vitest';
import type { Overlay } from '../../../../shared/series-api';
import { diffusionValue, emptyResults, memberResult } from '../series-fixture';
import { scaleColour } from '../temperature-scale';
import { heatCapacityChart } from './caloric-charts';
import { overlayChart } from './overlay-charts';
import { tableCsv } from './series-chart-spec';
import { arrheniusChart, diffusionChart, lindemannChart } from './state-charts';

const seriesData = (option: unknown, name: string): unknown[] => ((option as { series: { name: string; type: string; data: unknown[] }[] }).series.find((s) => s.name === name && s.type !== 'custom')?.data ?? []);

describe('overlay charts', () => {
  const msd = (trajectoryId: number, name: string, temperatureK: number | null, scale: number) => ({ trajectoryId, name, temperatureK, phase: null, reportId: trajectoryId, x: [0, 1, 2], y: [0, scale, 2 * scale] });
  const overlay = (lines: Overlay['lines']): Overlay => ({ kind: 'msd', x: { label: 'lag', unit: 'ps' }, y: { label: 'MSD all', unit: 'Å²' }, lines });

  it('when three members have an MSD, then each is one line ordered and coloured from the coldest to the hottest', () => {
    const spec = overlayChart(overlay([msd(2, 'hot', 300, 3), msd(1, 'cold', 100, 1), msd(3, 'mid', 200, 2)]))!;
    const lines = (spec.option as { series: { name: string; itemStyle: { color: string }; data: unknown[] }[] }).series;
    expect(lines.map((l) => l.name)).toEqual(['cold · 100 K', 'mid · 200 K', 'hot · 300 K']);
    expect(lines[0]!.itemStyle.color).toBe(scaleColour(0));
    expect(lines[1]!.itemStyle.color).toBe(scaleColour(0.5));
    expect(lines[2]!.itemStyle.color).toBe(scaleColour(1));
    // On log axes the zero lag cannot be drawn, but the CSV keeps it; units sit in the header.
    expect(lines[0]!.data).toHaveLength(2);
    expect(spec.table.columns).toEqual(['member', 'T (K)', 'lag (ps)', 'MSD all (Å²)']);
    expect(spec.table.rows).toContainEqual(['hot', 300, 2, 6]);
    expect(spec.table.rows).toHaveLength(9);
  });

  it('when no member has the curve, then there is no chart', () => {
    expect(overlayChart(overlay([]))).toBeNull();
  });
});

describe('D(T) and the Arrhenius plot', () => {
  const members = [100, 125, 150].map((t, i) => memberResult({ trajectoryId: i + 1, temperatureK: t, d: diffusionValue(Math.exp(-10_000 / (8.314462618 * t))), dStdError: diffusionValue(1e-7) }));
  const results = emptyResults(members);
  results.arrhenius = {
    ...results.arrhenius, status: 'fitted', message: null, activationEnergy: { kJPerMol: 10, eV: 10 / 96.485332 }, activationEnergyStdError: { kJPerMol: 0.1, eV: 0.001 },
    d0: diffusionValue(1), d0StdError: diffusionValue(0.05), rangeK: { min: 100, max: 150 },
    points: members.map((m) => ({ trajectoryId: m.trajectoryId, temperatureK: m.temperatureK!, d: m.d!.a2PerPs, dStdError: 1e-7, lnResidual: 0, normalisedResidual: 0 })),
  };

  it('when the fit is drawn, then its line is D₀·exp(−E_a/RT) at the ends of the fitted range (R = 8.314462618 J/(mol K), CODATA 2018)', () => {
    const spec = arrheniusChart(results, 'a2PerPs')!;
    const fitLine = (spec.option as { series: { name: string; data: [number, number][] }[] }).series.find((s) => s.name.startsWith('fit:'))!;
    expect(fitLine.name).toBe('fit: E_a = 10.00 ± 0.10 kJ/mol');
    // By hand: at 150 K, 1000/T = 6.667 and exp(−10000/(8.314462618·150)) = e^−8.0182 = 3.294 × 10⁻⁴.
    expect(fitLine.data[0]![0]).toBeCloseTo(6.6667, 3);
    expect(fitLine.data[0]![1]).toBeCloseTo(3.2943e-4, 7);
    expect(fitLine.data[1]![1]).toBeCloseTo(Math.exp(-10_000 / (8.314462618 * 100)), 12);
  });

  it('when D is shown in 10⁻⁹ m²/s, then points and CSV carry that unit and ten times the Å²/ps value', () => {
    const spec = diffusionChart(results, 'e9M2PerS')!;
    expect(spec.table.columns[2]).toBe('D (10⁻⁹ m²/s)');
    expect(spec.table.rows[0]![2]).toBeCloseTo(members[0]!.d!.a2PerPs * 10, 12);
  });

  it('when a member is excluded from fits, then its point is hollow and says so', () => {
    const excluded = emptyResults([{ ...members[0]!, excludedFromFits: true }, members[1]!]);
    const data = seriesData(diffusionChart(excluded, 'a2PerPs')!.option, 'D') as { itemStyle: { color: string }; tip: string }[];
    expect(data[0]!.itemStyle.color).toBe('#ffffff');
    expect(data[0]!.tip).toContain('excluded from fits');
    expect(data[1]!.tip).not.toContain('excluded');
  });
});

describe('Lindemann and Cv charts', () => {
  it('when members have Lindemann ratios, then the solid and fluid thresholds of the criteria are drawn', () => {
    const r = emptyResults([memberResult({ trajectoryId: 1, temperatureK: 80, lindemannRatio: 0.08 }), memberResult({ trajectoryId: 2, temperatureK: 120, lindemannRatio: 0.5 })]);
    const spec = lindemannChart(r)!;
    const marks = (spec.option as { series: { markLine: { data: { yAxis: number }[] } }[] }).series[0]!.markLine.data.map((d) => d.yAxis);
    expect(marks).toEqual([0.15, 0.3]);
  });

  it('when a slope spans a transition, then it is drawn apart from Cv, hollow, and the CSV says so', () => {
    const r = emptyResults([memberResult({ trajectoryId: 1, temperatureK: 80 }), memberResult({ trajectoryId: 2, temperatureK: 120 })]);
    r.heatCapacity = [
      { temperatureK: 100, perAtomKB: 40, stdErrorKB: 2, jPerMolK: 332.6, source: 'slope', trajectoryIds: [1, 2], acrossTransition: true, energyKind: 'total' },
      { temperatureK: 80, perAtomKB: 3.1, stdErrorKB: 0.2, jPerMolK: 25.8, source: 'fluctuation', trajectoryIds: [1], acrossTransition: false, energyKind: 'total' },
    ];
    const spec = heatCapacityChart(r)!;
    const names = (spec.option as { series: { name: string; type: string }[] }).series.filter((s) => s.type === 'scatter').map((s) => s.name);
    expect(names).toEqual(['slope across a transition (holds latent heat, not Cv)', 'energy fluctuations of one run']);
    expect(spec.table.rows[0]).toContain('yes');
  });
});

describe('chart CSV', () => {
  it('when text holds commas, quotes or starts like a formula, then it is quoted or kept as text; nulls are empty', () => {
    const csv = tableCsv({ columns: ['member', 'T (K)'], rows: [['a, "b"', 100], ['=1+1', null]] });
    expect(csv).toBe('member,T (K)\n"a, ""b""",100\n\'=1+1,\n');
  });
});
