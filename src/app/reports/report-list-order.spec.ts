import { describe, expect, it } from 'vitest';
import type { ReportListItem } from '../../../shared/report';
import { filterAndOrder, keyNumberTexts } from './report-list-order';

const item = (id: number, changes: Partial<ReportListItem> & { d?: number; t?: number }): ReportListItem => ({
  id, trajectoryId: 1, trajectoryName: 'argon.extxyz', title: `argon.extxyz: MSD ${id}`, notes: '', analyses: ['msd'],
  createdAt: `2026-03-0${id}T10:00:00.000Z`,
  keyNumbers: {
    diffusion: changes.d === undefined ? null : { e9M2PerS: changes.d, stdError: 0.1, method: 'Einstein' },
    temperatureK: changes.t === undefined ? null : { mean: changes.t, stdError: 1 }, vdosPeaksCm1: [], rdfFirstPeakA: null,
  },
  ...changes,
});

describe('the project report list', () => {
  const reports = [item(1, { d: 2.4, t: 120 }), item(2, { d: 5.1, notes: 'fit window moved later', t: 160 }), item(3, {}), item(4, { d: 0.3 })];

  it('when sorted by D, then the fastest comes first and reports without D go last', () => {
    expect(filterAndOrder(reports, '', 'diffusion').map((r) => r.id)).toEqual([2, 1, 4, 3]);
  });

  it('when sorted by date, then newest or oldest first', () => {
    expect(filterAndOrder(reports, '', 'newest').map((r) => r.id)).toEqual([4, 3, 2, 1]);
    expect(filterAndOrder(reports, '', 'oldest').map((r) => r.id)).toEqual([1, 2, 3, 4]);
  });

  it('when filtered, then every word must appear in the title, file, notes, analyses or key numbers', () => {
    expect(filterAndOrder(reports, 'window LATER', 'newest').map((r) => r.id)).toEqual([2]);
    expect(filterAndOrder(reports, '160', 'newest').map((r) => r.id)).toEqual([2]);
    expect(filterAndOrder(reports, 'argon msd', 'newest')).toHaveLength(4);
    expect(filterAndOrder(reports, 'krypton', 'newest')).toEqual([]);
  });

  it('when key numbers are shown, then each carries its unit and D its method and error', () => {
    expect(keyNumberTexts({ ...item(9, {}), keyNumbers: { diffusion: { e9M2PerS: 2.43, stdError: 0.11, method: 'Green–Kubo' }, temperatureK: { mean: 299.6, stdError: 1.8 }, vdosPeaksCm1: [120.4, 480], rdfFirstPeakA: 3.81 } }))
      .toEqual(['D = 2.43 ± 0.11 × 10⁻⁹ m²/s (Green–Kubo)', 'T = 299.6 ± 1.8 K', 'VDOS peaks 120.4, 480 cm⁻¹', 'g(r) peak at 3.81 Å']);
  });
});
