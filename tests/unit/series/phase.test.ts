import { describe, expect, it } from 'vitest';
import { namePhase, namePhases, type PhaseInput } from '../../../server/analysis/series/phase.ts';
import type { RdfShape } from '../../../shared/series-results.ts';

// Signatures of melting and vaporization, SCIENCE item 31 [COMMON PRACTICE]; thresholds in phase-criteria.ts.
const shape = (ratio: number, packing: number | null = 1.0): RdfShape => ({
  firstPeak: { rA: 3.7, g: 3 }, firstMinimum: { rA: 5.2, g: 3 * ratio, coordination: 12 }, minToPeakRatio: ratio, packing, pair: 'all', shells: true,
});

const solid: PhaseInput = { d: null, dStdError: null, regime: 'bounded', plateauA2: 0.4, lindemannRatio: 0.08, rdf: shape(0.08), densityGPerCm3: 1.6, sqPeak: { qInvA: 1.9, s: 3.1 }, label: '40 K' };
const liquid: PhaseInput = { d: 0.17, dStdError: 0.005, regime: 'diffusive', lindemannRatio: 0.55, rdf: shape(0.2), densityGPerCm3: 1.42, sqPeak: { qInvA: 2.0, s: 1.9 }, label: '90 K' };
const vapour: PhaseInput = { d: 10, dStdError: 0.3, regime: 'superdiffusive', lindemannRatio: 1.2, rdf: shape(0.49, 0.06), densityGPerCm3: 0.08, sqPeak: { qInvA: 2.0, s: 1.05 }, label: '150 K' };

describe('a phase per member, with its evidence beside it', () => {
  it('when the MSD levels off, the Lindemann ratio is small and g(r) has a deep first minimum, then the member is solid', () => {
    const p = namePhase(solid, null);
    expect(p.phase).toBe('solid');
    expect(p.evidence.map((e) => [e.kind, e.verdict])).toEqual([
      ['diffusion', 'solid'], ['lindemann', 'solid'], ['structure', 'solid'], ['density', 'condensed'], ['structure-factor', 'solid'],
    ]);
    expect(p.evidence[0]!.detail).toMatch(/levels off at 0\.400 Å²/);
  });

  it('when D is positive but within two standard errors of zero, then diffusion reads as solid-like and says why', () => {
    const p = namePhase({ ...solid, regime: 'diffusive', d: 0.004, dStdError: 0.003 }, null);
    expect(p.evidence[0]).toMatchObject({ verdict: 'solid', value: 0.004 });
    expect(p.evidence[0]!.detail).toMatch(/zero within 2 standard errors/);
    expect(p.phase).toBe('solid');
  });

  it('when atoms diffuse at the density of the series\' solid, then the member is liquid', () => {
    const [s, l] = namePhases([solid, liquid]);
    expect(s!.phase).toBe('solid');
    expect(l!.phase).toBe('liquid');
    expect(l!.evidence.find((e) => e.kind === 'density')!.detail).toMatch(/0\.89 of 40 K/);
  });

  it('when atoms diffuse at a twentieth of the condensed density with gas-like g(r), then the member is vapour', () => {
    const phases = namePhases([solid, liquid, vapour]);
    expect(phases.map((p) => p.phase)).toEqual(['solid', 'liquid', 'vapour']);
    expect(phases[2]!.evidence.find((e) => e.kind === 'density')!.verdict).toBe('vapour');
  });

  it('when a run shows no diffusion but liquid-like g(r), then the phase is unclear (a glass, or too short a run)', () => {
    const p = namePhase({ ...solid, rdf: shape(0.22), lindemannRatio: 0.12 }, null);
    expect(p.phase).toBe('unclear');
    expect(p.reason).toMatch(/glass/);
  });

  it('when atoms diffuse yet g(r) is crystal-like, then the phase is unclear rather than a guess', () => {
    expect(namePhase({ ...liquid, rdf: shape(0.09) }, null).phase).toBe('unclear');
  });

  it('when a report lacks an analysis, then that evidence is marked missing, never invented', () => {
    const p = namePhase({ ...liquid, lindemannRatio: null, sqPeak: null, densityGPerCm3: null, rdf: null }, null);
    expect(p.evidence.filter((e) => e.verdict === 'missing').map((e) => e.kind)).toEqual(['lindemann', 'structure', 'density', 'structure-factor']);
    expect(p.phase).toBe('unclear');
  });

  it('when every member is a dilute gas, then packing alone names them vapour (no condensed member to compare with)', () => {
    const phases = namePhases([vapour, { ...vapour, label: '200 K', densityGPerCm3: 0.03, rdf: shape(0.54, 0.03) }]);
    expect(phases.map((p) => p.phase)).toEqual(['vapour', 'vapour']);
  });
});
