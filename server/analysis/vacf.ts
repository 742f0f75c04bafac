/**
 * Velocity autocorrelation over all time origins (FFT), absolute and
 * normalised, per species and over the selection, plus the mass-weighted sum
 * the VDOS needs and the running Green–Kubo integral D(t) = (1/d)∫C.
 *
 * The Green–Kubo plateau is read automatically where the normalised VACF has
 * decayed for good: from the first lag after which |C/C(0)| stays below
 * GK_DECAY_THRESHOLD up to the analysis end (lag ≤ a quarter of the run), the
 * plateau value is the mean of D(t) over [t_p, min(2·t_p, end)] and its
 * spread is the standard deviation there. A manual window overrides it.
 */
import { AtomSeriesReader } from './atom-series.ts';
import { componentIndices, selectAtoms, type Components } from './atom-groups.ts';
import { Autocorrelator } from './fft.ts';
import { frameIntervalPs, lagCount } from './frame-timing.ts';
import type { Trajectory } from './trajectory.ts';
import { diffusionUnits, type DiffusionUnits } from './units.ts';

export const GK_DECAY_THRESHOLD = 0.01;

export interface VacfOptions {
  species?: readonly string[];
  components?: Components;
  maxLagPs?: number;
  /** Manual Green–Kubo plateau window. */
  gkWindowPs?: { startPs: number; endPs: number };
  removeComDrift?: boolean;
  masses?: Readonly<Record<string, number>>;
  /** Use central differences of positions even when velocities are stored. */
  forceFromPositions?: boolean;
}

export interface GreenKubo {
  d: DiffusionUnits;
  /** Spread of D(t) across the plateau window. */
  dSpread: DiffusionUnits;
  window: { startPs: number; endPs: number; source: 'auto' | 'manual' };
  converged: boolean;
}

export interface VacfGroupResult {
  label: string;
  nAtoms: number;
  /** ⟨v(0)·v(t)⟩ per atom over the chosen components, Å²/ps². */
  vacfA2PerPs2: Float64Array;
  normalised: Float64Array;
  /** Running Green–Kubo integral (1/d)∫₀ᵗ C dt', Å²/ps. */
  runningDA2PerPs: Float64Array;
  greenKubo: GreenKubo;
  /** Σ over atoms of m·⟨v(0)·v(t)⟩, u·Å²/ps², for the VDOS. */
  massWeightedSum: Float64Array;
  totalMassU: number;
}

export interface VacfResult {
  units: { lag: 'ps'; vacf: 'Å²/ps²'; runningD: 'Å²/ps' };
  lagPs: Float64Array;
  /** Frame interval of the velocity series, ps. */
  dtPs: number;
  velocitySource: 'stored-velocities' | 'central-differences';
  dimensions: number;
  components: Components;
  comDriftRemoved: boolean;
  groups: VacfGroupResult[];
}

export function vacf(traj: Trajectory, options: VacfOptions = {}, onProgress?: (fraction: number) => void): VacfResult {
  const dt = frameIntervalPs(traj);
  const components = options.components ?? 'xyz';
  const dims = componentIndices(components);
  const sel = selectAtoms(traj, options.species, options.masses);
  const removeCom = options.removeComDrift ?? true;
  const useStored = traj.velocities !== undefined && !options.forceFromPositions;
  const view: Trajectory = useStored ? traj : { ...traj, velocities: undefined };
  const reader = new AtomSeriesReader(view, sel.masses, removeCom);
  const L = reader.velocityLength;
  if (L < 2) throw new Error('The VACF needs at least two velocity frames (four frames without stored velocities).');
  const nLags = lagCount(L, dt, options.maxLagPs, 0.5);
  const lagPs = Float64Array.from({ length: nLags }, (_, m) => m * dt);
  const correlator = new Autocorrelator(L);
  const velocities = new Float64Array(3 * L);
  const scratch = new Float64Array(3 * traj.nFrames);
  const lagSums = new Float64Array(nLags);
  const perAtom = new Float64Array(nLags);

  const sums = sel.groups.map(() => new Float64Array(nLags));
  const weighted = sel.groups.map(() => new Float64Array(nLags));
  const memberOf = sel.groups.map((g) => new Set(g.atoms));

  sel.atoms.forEach((atom, k) => {
    reader.velocities(atom, velocities, dt, scratch);
    perAtom.fill(0);
    for (const c of dims) {
      correlator.correlate(velocities, lagSums, c * L);
      for (let m = 0; m < nLags; m++) perAtom[m] += lagSums[m] / (L - m);
    }
    const mass = sel.masses[atom];
    sel.groups.forEach((_, gi) => {
      if (!memberOf[gi].has(atom)) return;
      const s = sums[gi], w = weighted[gi];
      for (let m = 0; m < nLags; m++) {
        s[m] += perAtom[m];
        w[m] += mass * perAtom[m];
      }
    });
    onProgress?.((k + 1) / sel.atoms.length);
  });

  const end = Math.min(nLags - 1, Math.floor((L - 1) / 4));
  const groups = sel.groups.map((g, gi): VacfGroupResult => {
    const n = g.atoms.length;
    const c = sums[gi].map((v) => v / n);
    const c0 = c[0];
    const normalised = c.map((v) => (c0 > 0 ? v / c0 : 0));
    const running = runningIntegral(c, dt, dims.length);
    let totalMass = 0;
    for (const a of g.atoms) totalMass += sel.masses[a];
    return {
      label: g.label,
      nAtoms: n,
      vacfA2PerPs2: c,
      normalised,
      runningDA2PerPs: running,
      greenKubo: plateau(normalised, running, lagPs, end, options.gkWindowPs),
      massWeightedSum: weighted[gi],
      totalMassU: totalMass,
    };
  });
  return {
    units: { lag: 'ps', vacf: 'Å²/ps²', runningD: 'Å²/ps' },
    lagPs,
    dtPs: dt,
    velocitySource: useStored ? 'stored-velocities' : 'central-differences',
    dimensions: dims.length,
    components,
    comDriftRemoved: removeCom,
    groups,
  };
}

/** Trapezoid running integral (1/d)∫₀ᵗ C dt'. */
function runningIntegral(c: Float64Array, dt: number, d: number): Float64Array {
  const out = new Float64Array(c.length);
  let acc = 0;
  for (let m = 1; m < c.length; m++) {
    acc += 0.5 * (c[m - 1] + c[m]) * dt;
    out[m] = acc / d;
  }
  return out;
}

function plateau(norm: Float64Array, running: Float64Array, lagPs: Float64Array, end: number, manual?: { startPs: number; endPs: number }): GreenKubo {
  const dt = lagPs.length > 1 ? lagPs[1] - lagPs[0] : 1;
  let i0: number, i1: number, converged = true;
  if (manual) {
    i0 = Math.max(0, Math.round(manual.startPs / dt));
    i1 = Math.min(running.length - 1, Math.round(manual.endPs / dt));
    if (i1 < i0) throw new Error('The Green–Kubo window is empty.');
  } else {
    let p = end;
    while (p > 0 && Math.abs(norm[p]) < GK_DECAY_THRESHOLD) p--;
    i0 = Math.min(p + 1, end);
    if (i0 >= end) {
      converged = false;
      i0 = Math.floor(end / 2);
    }
    i1 = Math.min(end, Math.max(i0, 2 * i0));
  }
  let mean = 0;
  for (let i = i0; i <= i1; i++) mean += running[i];
  mean /= i1 - i0 + 1;
  let variance = 0;
  for (let i = i0; i <= i1; i++) variance += (running[i] - mean) ** 2;
  variance /= Math.max(1, i1 - i0);
  return {
    d: diffusionUnits(mean),
    dSpread: diffusionUnits(Math.sqrt(variance)),
    window: { startPs: lagPs[i0], endPs: lagPs[i1], source: manual ? 'manual' : 'auto' },
    converged,
  };
}
