/**
 * Non-Gaussian parameter α₂(t) = d·⟨r⁴⟩/((d+2)·⟨r²⟩²) − 1 (3⟨r⁴⟩/(5⟨r²⟩²) − 1
 * in 3-D; Rahman, Phys. Rev. 136, A405 (1964)), zero when displacements are
 * Gaussian. ⟨r⁴⟩ has no FFT shortcut, so it is evaluated directly on about
 * LAGS_PER_DECADE log-spaced lags, with origins strided to keep the work
 * within budget.
 *
 * α₂ is computed per species and never over unlike atoms together: pooling
 * two Gaussian walkers with different D gives a mixture of Gaussians, whose
 * α₂ is positive although each species' is zero.
 */
import { AtomSeriesReader } from './atom-series.ts';
import { componentIndices, selectAtoms, type Components } from './atom-groups.ts';
import { frameIntervalPs, lagCount } from './frame-timing.ts';
import type { Trajectory } from './trajectory.ts';

export const LAGS_PER_DECADE = 20;

export interface NgpOptions {
  species?: readonly string[];
  components?: Components;
  maxLagPs?: number;
  removeComDrift?: boolean;
  masses?: Readonly<Record<string, number>>;
  /** Displacement evaluations allowed (atoms × lags × origins). */
  budget?: number;
}

export interface NgpGroupResult {
  /** A species, or "all" when the selection holds one species. */
  label: string;
  nAtoms: number;
  alpha2: Float64Array;
  /** ⟨r²⟩ at the same lags, Å². */
  msdA2: Float64Array;
  peak: { lagPs: number; alpha2: number } | null;
}

export interface NgpResult {
  units: { lag: 'ps'; alpha2: '1' };
  lagPs: Float64Array;
  /** One per species of the selection. */
  groups: NgpGroupResult[];
  originStride: number;
}

export function ngp(traj: Trajectory, options: NgpOptions = {}, onProgress?: (fraction: number) => void): NgpResult {
  const dt = frameIntervalPs(traj);
  const T = traj.nFrames;
  const dims = componentIndices(options.components ?? 'xyz');
  const dd = dims.length;
  const sel = selectAtoms(traj, options.species, options.masses);
  const reader = new AtomSeriesReader(traj, sel.masses, options.removeComDrift ?? true);
  const maxLag = lagCount(T, dt, options.maxLagPs, 0.5) - 1;
  const lags: number[] = [];
  for (let k = 0; ; k++) {
    const m = Math.round(10 ** (k / LAGS_PER_DECADE));
    if (m > maxLag) break;
    if (lags[lags.length - 1] !== m) lags.push(m);
  }
  const evaluations = sel.atoms.length * lags.reduce((s, m) => s + (T - m), 0);
  const stride = Math.max(1, Math.ceil(evaluations / (options.budget ?? 2e8)));
  // Species only: "all" is kept when it is a single species, never as a pool of unlike atoms.
  const groups = sel.groups.length > 1 ? sel.groups.slice(1) : sel.groups;
  const groupOf = new Int32Array(traj.nAtoms).fill(-1);
  groups.forEach((g, gi) => g.atoms.forEach((a) => (groupOf[a] = gi)));
  const sums = groups.map(() => ({ r2: new Float64Array(lags.length), r4: new Float64Array(lags.length), count: new Float64Array(lags.length) }));
  const u = new Float64Array(3 * T);
  sel.atoms.forEach((atom, k) => {
    reader.unwrapped(atom, u);
    const { r2, r4, count } = sums[groupOf[atom]];
    lags.forEach((m, li) => {
      let s2 = 0, s4 = 0, c = 0;
      for (let t = 0; t + m < T; t += stride) {
        let q = 0;
        for (const comp of dims) {
          const v = u[comp * T + t + m] - u[comp * T + t];
          q += v * v;
        }
        s2 += q;
        s4 += q * q;
        c++;
      }
      r2[li] += s2;
      r4[li] += s4;
      count[li] += c;
    });
    onProgress?.((k + 1) / sel.atoms.length);
  });
  return {
    units: { lag: 'ps', alpha2: '1' },
    lagPs: Float64Array.from(lags, (m) => m * dt),
    groups: groups.map((g, gi): NgpGroupResult => {
      const { r2, r4, count } = sums[gi];
      const msdA2 = r2.map((v, i) => v / count[i]);
      const alpha2 = r4.map((v, i) => (dd * (v / count[i])) / ((dd + 2) * msdA2[i] ** 2) - 1);
      let peak: NgpGroupResult['peak'] = null;
      alpha2.forEach((a, i) => {
        if (Number.isFinite(a) && (!peak || a > peak.alpha2)) peak = { lagPs: lags[i] * dt, alpha2: a };
      });
      return { label: g.label, nAtoms: g.atoms.length, alpha2, msdA2, peak };
    }),
    originStride: stride,
  };
}
