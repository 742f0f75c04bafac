import { describe, expect, it } from 'vitest';
import type { SeriesMemberDto } from '../../../shared/series-api';
import type { TrajectoryDto } from '../../../shared/trajectory';
import { memberRows } from './member-rows';
import { diffusionValue, emptyResults, memberResult } from './series-fixture';
import { suggestedSeriesName, temperatureOrder } from './series-naming';

function member(trajectoryId: number, position: number, over: Partial<SeriesMemberDto> = {}): SeriesMemberDto {
  return {
    trajectoryId, trajectoryName: `run-${trajectoryId}.extxyz`, position, branch: null, excludedFromFit: false, statedTemperatureK: null, measuredTemperatureK: null,
    densityGPerCm3: null, pressureBar: null, atoms: 108, analyses: ['thermo', 'msd'], status: 'done', progress: 100, message: null, runs: [], reportIds: [], reportByAnalysis: {},
    ...over,
  };
}

describe('member rows', () => {
  it('when members come out of order, then rows follow their positions and number them from 1', () => {
    const rows = memberRows([member(5, 1), member(7, 0)], null, 'a2PerPs');
    expect(rows.map((r) => [r.order, r.member.trajectoryId])).toEqual([[1, 7], [2, 5]]);
  });

  it('when a member has results, then its temperature, density and D are worded with their errors in the chosen unit', () => {
    const result = memberResult({ trajectoryId: 3, temperatureK: 89.6, measuredTemperatureK: { mean: 89.64, stdError: 0.71 }, densityGPerCm3: { mean: 1.4125, stdError: 0.0021 }, d: diffusionValue(0.245), dStdError: diffusionValue(0.012) });
    const [row] = memberRows([member(3, 0, { statedTemperatureK: 90, reportByAnalysis: { msd: 41, thermo: 40 } })], emptyResults([result]), 'e9M2PerS');
    expect(row!.statedT).toBe('90');
    expect(row!.measuredT).toBe('89.64 ± 0.71');
    expect(row!.density).toBe('1.4125 ± 0.0021');
    expect(row!.d).toBe('2.45 ± 0.12');
    expect(row!.reportId).toBe(41);
  });

  it('when a member has no results yet, then its numbers read as not known and it has no phase', () => {
    const [row] = memberRows([member(3, 0, { status: 'running', progress: 40 })], null, 'a2PerPs');
    expect([row!.measuredT, row!.density, row!.pressure, row!.d]).toEqual(['—', '—', '—', '—']);
    expect(row!.result).toBeNull();
  });
});

describe('naming a new series', () => {
  const t = (id: number, temperatureK: number | null): TrajectoryDto => ({ id, name: `r${id}`, temperatureK, speciesCounts: { Ar: 108 } }) as unknown as TrajectoryDto;

  it('when runs are ticked in any order, then the series lists them coldest first, runs without a temperature last', () => {
    expect(temperatureOrder([t(1, 130), t(2, null), t(3, 40), t(4, 90)]).map((x) => x.id)).toEqual([3, 4, 1, 2]);
  });

  it('when the runs state species and temperatures, then the suggested name says both', () => {
    expect(suggestedSeriesName([t(3, 40), t(4, 90), t(1, 130)])).toBe('Ar from 40 to 130 K');
    expect(suggestedSeriesName([t(3, null), t(4, null)])).toBe('Ar series');
  });
});
