/**
 * Velocity autocorrelation over all time origins (FFT), absolute and
 * normalised, per species and over the selection, plus the mass-weighted sum
 * the VDOS needs and the running Green–Kubo integral D(t) = (1/d)∫C.
 *
 * The Green–Kubo plateau is read automatically where the normalised VACF has
 * decayed for good: from the first lag after which |C/C(0)| stays below
 * GK_DECAY_THRESHOLD up to the analysis end (lag ≤ a quarter of the run), the
 * plateau value is the mean of D(t) over [t_p, min(2·t_p, end)]. A manual
 * window overrides it. Its standard error comes from independent blocks
 * (independent-blocks.ts): the same plateau mean taken in up to 16 groups of
 * atoms, or, for fewer than 5 atoms, in consecutive stretches of the run. The
 * spread of D(t) across the window is kept too, but it is not an error bar.
 */
import { AtomSeriesReader } from './atom-series.ts';
import { componentIndices, selectAtoms, type Components } from './atom-groups.ts';
import { Autocorrelator } from './fft.ts';
import { atomBlockIndex, blockStandardError, timeSegments } from './independent-blocks.ts';
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
  /** Standard error from independent blocks; null when there are too few atoms and too short a run. */
  dStdError: DiffusionUnits | null;
  uncertaintyMethod: 'atom-blocks' | 'time-blocks' | 'none';
  uncertaintyBlocks: number;
  /** Spread of D(t) across the plateau window (not an error bar). */
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
  // Each atom's power spectrum (over the components) goes into its group's
  // plain and mass-weighted sums and its block; one inverse transform per sum
  // at the end gives Σ⟨v(0)·v(t)⟩, as the transform is linear.
  const P = correlator.powerLength;
  const perAtom = new Float64Array(P);

  const sums = sel.groups.map(() => new Float64Array(P));
  const weighted = sel.groups.map(() => new Float64Array(P));
  const memberOf = sel.groups.map((g) => new Set(g.atoms));
  const blockPlans = sel.groups.map((g) => atomBlockIndex(g.atoms.length));
  const blockPowers = blockPlans.map((plan) => Array.from({ length: plan?.blocks ?? 0 }, () => new Float64Array(P)));
  const blockCount = blockPlans.map((plan) => new Float64Array(plan?.blocks ?? 0));
  const seen = sel.groups.map(() => 0);

  sel.atoms.forEach((atom, k) => {
    reader.velocities(atom, velocities, dt, scratch);
    perAtom.fill(0);
    for (const c of dims) correlator.addPower(velocities, perAtom, c * L);
    const mass = sel.masses[atom];
    sel.groups.forEach((_, gi) => {
      if (!memberOf[gi].has(atom)) return;
      const s = sums[gi], w = weighted[gi];
      for (let q = 0; q < P; q++) {
        s[q] += perAtom[q];
        w[q] += mass * perAtom[q];
      }
      const plan = blockPlans[gi];
      const member = seen[gi]++;
      if (plan) {
        const b = plan.of(member);
        const block = blockPowers[gi][b];
        for (let q = 0; q < P; q++) block[q] += perAtom[q];
        blockCount[gi][b]++;
      }
    });
    onProgress?.((k + 1) / sel.atoms.length);
  });
  /** Σ over the summed series of ⟨v(0)·v(t)⟩ for lags 0..nLags−1. */
  const lagMeans = (power: Float64Array): Float64Array => {
    const out = correlator.lagSumsOf(power, new Float64Array(nLags));
    for (let m = 0; m < nLags; m++) out[m] /= L - m;
    return out;
  };
  const blockSums = blockPowers.map((group) => group.map(lagMeans));
  const weightedSums = weighted.map(lagMeans);

  const end = Math.min(nLags - 1, Math.floor((L - 1) / 4));
  const groups = sel.groups.map((g, gi): VacfGroupResult => {
    const n = g.atoms.length;
    const c = lagMeans(sums[gi]).map((v) => v / n);
    const c0 = c[0];
    const normalised = c.map((v) => (c0 > 0 ? v / c0 : 0));
    const running = runningIntegral(c, dt, dims.length);
    let totalMass = 0;
    for (const a of g.atoms) totalMass += sel.masses[a];
    const gk = plateau(normalised, running, lagPs, end, options.gkWindowPs);
    const blockValues = blockSums[gi].map((b, bi) => windowMean(runningIntegral(b.map((v) => v / blockCount[gi][bi]), dt, dims.length), gk.indices));
    const error = blockValues.length > 0
      ? { se: blockStandardError(blockValues), method: 'atom-blocks' as const, blocks: blockValues.length }
      : timeBlockError(g.atoms, reader, dt, dims, gk.indices);
    return {
      label: g.label,
      nAtoms: n,
      vacfA2PerPs2: c,
      normalised,
      runningDA2PerPs: running,
      greenKubo: {
        d: gk.d, dSpread: gk.dSpread, window: gk.window, converged: gk.converged,
        dStdError: error ? diffusionUnits(error.se) : null, uncertaintyMethod: error?.method ?? 'none', uncertaintyBlocks: error?.blocks ?? 0,
      },
      massWeightedSum: weightedSums[gi],
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

/** Mean of a running integral over lags i0..i1. */
function windowMean(running: Float64Array, [i0, i1]: [number, number]): number {
  let mean = 0;
  for (let i = i0; i <= i1; i++) mean += running[i];
  return mean / (i1 - i0 + 1);
}

/**
 * For a group too small for atom blocks: the plateau mean of the VACF
 * integral for each of its atoms in each consecutive stretch of the run.
 */
function timeBlockError(atoms: Int32Array, reader: AtomSeriesReader, dt: number, dims: number[], window: [number, number]): { se: number; method: 'time-blocks'; blocks: number } | null {
  const L = reader.velocityLength;
  const plan = timeSegments(L, window[1], atoms.length);
  if (!plan) return null;
  const S = plan.length, nLags = window[1] + 1;
  const correlator = new Autocorrelator(S);
  const lagSums = new Float64Array(nLags), curve = new Float64Array(nLags);
  const velocities = new Float64Array(3 * L), scratch = new Float64Array(3 * reader.nFrames);
  const values: number[] = [];
  for (const atom of atoms) {
    reader.velocities(atom, velocities, dt, scratch);
    for (let b = 0; b < plan.segments; b++) {
      curve.fill(0);
      for (const c of dims) {
        correlator.correlate(velocities, lagSums, c * L + b * S);
        for (let m = 0; m < nLags; m++) curve[m] += lagSums[m] / (S - m);
      }
      values.push(windowMean(runningIntegral(curve, dt, dims.length), window));
    }
  }
  return { se: blockStandardError(values), method: 'time-blocks', blocks: values.length };
}

function plateau(norm: Float64Array, running: Float64Array, lagPs: Float64Array, end: number, manual?: { startPs: number; endPs: number }): Omit<GreenKubo, 'dStdError' | 'uncertaintyMethod' | 'uncertaintyBlocks'> & { indices: [number, number] } {
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
    indices: [i0, i1],
  };
}
