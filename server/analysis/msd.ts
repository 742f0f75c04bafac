/**
 * Mean-squared displacement per species and over the selection, from
 * unwrapped positions, over all time origins (FFT algorithm), with Einstein
 * diffusion coefficients fitted on the diffusive window.
 *
 * The standard error of each D comes from independent blocks
 * (independent-blocks.ts): up to 16 contiguous groups of atoms, each fitted
 * over the same window; a group of fewer than 5 atoms is instead cut into
 * consecutive stretches of the run, each long enough for the window.
 */
import { AtomSeriesReader } from './atom-series.ts';
import { componentIndices, selectAtoms, type Components } from './atom-groups.ts';
import { diffusionOverWindow, fitDiffusion, type DiffusionFit } from './diffusion-fit.ts';
import { atomBlockIndex, blockStandardError, timeSegments } from './independent-blocks.ts';
import { diffusionUnits } from './units.ts';
import { FftMsd } from './fft-msd.ts';
import { frameIntervalPs, lagCount } from './frame-timing.ts';
import type { Trajectory } from './trajectory.ts';

export interface MsdOptions {
  species?: readonly string[];
  /** Cartesian components (default "xyz"); d = their count enters D = slope/(2d). */
  components?: Components;
  /** Longest lag computed, ps (default half the run). */
  maxLagPs?: number;
  /** Manual fit window; automatic when absent. */
  fitWindowPs?: { startPs: number; endPs: number };
  /** Subtract the mass-weighted centre-of-mass motion (default true). */
  removeComDrift?: boolean;
  masses?: Readonly<Record<string, number>>;
  /** Only for demonstrating the wrap-around error of an unpadded FFT. */
  zeroPad?: boolean;
}

export interface MsdGroupResult {
  label: string;
  nAtoms: number;
  msdA2: Float64Array;
  diffusion: DiffusionFit;
}

export interface MsdResult {
  units: { lag: 'ps'; msd: 'Å²' };
  lagPs: Float64Array;
  dimensions: number;
  /** The components the MSD curves and D are over: those asked for, less any that do not repeat when some do. */
  components: Components;
  /**
   * For a system periodic along some directions only (a slab, a wire): which
   * repeat, the MSD of all selected atoms along each of x, y, z, and why D
   * was taken from the components it was. Null when every direction repeats
   * or none does.
   */
  partlyPeriodic: { periodicAxes: Components; perAxisA2: [Float64Array, Float64Array, Float64Array]; note: string } | null;
  unwrapped: boolean;
  comDriftRemoved: boolean;
  /** "all" first, then one per species. */
  groups: MsdGroupResult[];
}

/** The automatic fit window ends at lag ≤ run length / this. */
export const AUTO_FIT_END_FRACTION_INVERSE = 4;

export function msd(traj: Trajectory, options: MsdOptions = {}, onProgress?: (fraction: number) => void): MsdResult {
  const dt = frameIntervalPs(traj);
  const T = traj.nFrames;
  const asked = options.components ?? 'xyz';
  const sel = selectAtoms(traj, options.species, options.masses);
  const removeCom = options.removeComDrift ?? true;
  const reader = new AtomSeriesReader(traj, sel.masses, removeCom);
  const geom = reader.geometry;
  const slab = geom?.partlyPeriodic ? directionsFor(asked, geom.periodic) : null;
  const components = slab?.components ?? asked;
  const dims = componentIndices(components);
  const nLags = lagCount(T, dt, options.maxLagPs, 0.5);
  const lagPs = Float64Array.from({ length: nLags }, (_, m) => m * dt);
  const engine = new FftMsd(T, nLags, { zeroPad: options.zeroPad });
  const series = new Float64Array(3 * T);
  // Each atom's power spectra and running sums go into its groups, blocks
  // and axes; one inverse transform per sum at the end gives their MSDs.
  const perAtom = engine.newSum();
  const component = engine.newSum();
  const perAxisSums = slab ? [0, 1, 2].map(() => engine.newSum()) : [];

  const groupOf = new Map<number, number[]>();
  sel.groups.forEach((g, gi) => g.atoms.forEach((a) => groupOf.set(a, [...(groupOf.get(a) ?? []), gi])));
  const groupSums = sel.groups.map(() => engine.newSum());
  const blockPlans = sel.groups.map((g) => atomBlockIndex(g.atoms.length));
  const blockSums = blockPlans.map((plan) => Array.from({ length: plan?.blocks ?? 0 }, () => engine.newSum()));
  const blockCount = blockPlans.map((plan) => new Float64Array(plan?.blocks ?? 0));
  const seen = sel.groups.map(() => 0);

  sel.atoms.forEach((atom, k) => {
    reader.unwrapped(atom, series);
    perAtom.clear();
    if (slab) {
      // Each direction on its own, so a slab's in-plane and normal motion can be told apart.
      for (let c = 0; c < 3; c++) {
        component.clear();
        engine.addTo(series, c * T, component);
        perAxisSums[c]!.add(component);
        if (dims.includes(c)) perAtom.add(component);
      }
    } else {
      for (const c of dims) engine.addTo(series, c * T, perAtom);
    }
    for (const gi of groupOf.get(atom) ?? []) {
      groupSums[gi]!.add(perAtom);
      const plan = blockPlans[gi];
      const member = seen[gi]++;
      if (!plan) continue;
      const b = plan.of(member);
      blockSums[gi]![b]!.add(perAtom);
      blockCount[gi][b]++;
    }
    onProgress?.((k + 1) / sel.atoms.length);
  });
  const sums = groupSums.map((sum) => engine.curveOf(sum));
  const blocks = blockSums.map((group) => group.map((sum) => engine.curveOf(sum)));
  const perAxis = (slab ? perAxisSums.map((sum) => engine.curveOf(sum)) : [0, 1, 2].map(() => new Float64Array(nLags))) as [Float64Array, Float64Array, Float64Array];

  // Origins thin out at long lags; a quarter of the run keeps ≥ 3/4 of them.
  const endIndex = Math.min(nLags - 1, Math.floor((T - 1) / AUTO_FIT_END_FRACTION_INVERSE));
  const groups = sel.groups.map((g, gi): MsdGroupResult => {
    const n = g.atoms.length;
    const curve = sums[gi].map((v) => v / n);
    const blockCurves = blocks[gi].map((b, bi) => b.map((v) => v / blockCount[gi][bi]));
    let diffusion = fitDiffusion({ lagPs, msd: curve, blocks: blockCurves, dimensions: dims.length, endIndex, window: options.fitWindowPs });
    if (diffusion.d && diffusion.uncertaintyMethod === 'none') diffusion = withTimeBlocks(diffusion, g.atoms, reader, dt, dims);
    return { label: g.label, nAtoms: n, msdA2: curve, diffusion };
  });
  const partlyPeriodic = slab ? { periodicAxes: slab.periodicAxes, perAxisA2: perAxis.map((a) => a.map((v) => v / sel.atoms.length)) as [Float64Array, Float64Array, Float64Array], note: slab.note } : null;
  return { units: { lag: 'ps', msd: 'Å²' }, lagPs, dimensions: dims.length, components, partlyPeriodic, unwrapped: reader.unwraps, comDriftRemoved: removeCom, groups };
}

/**
 * Components for D in a system periodic along some directions only: along a
 * direction that does not repeat the motion is bounded by walls or vacuum,
 * so its MSD levels off and mixing it in would bias D low. D comes from the
 * periodic components asked for; if none was asked for, from those asked,
 * with a note that it is no bulk value.
 */
function directionsFor(asked: Components, periodic: readonly boolean[]): { components: Components; periodicAxes: Components; note: string } {
  const periodicAxes = 'xyz'.split('').filter((_, k) => periodic[k]).join('') as Components;
  const kept = asked.split('').filter((ch) => periodic['xyz'.indexOf(ch)]).join('') as Components;
  const dropped = asked.split('').filter((ch) => !periodic['xyz'.indexOf(ch)]);
  if (!kept) {
    return { components: asked, periodicAxes, note: `Only ${periodicAxes.split('').join(', ')} repeat; D along ${asked.split('').join(', ')} is over directions bounded by walls or vacuum and is not a bulk diffusion coefficient.` };
  }
  const note = dropped.length
    ? `Periodic along ${periodicAxes.split('').join(', ')} only: D from the ${kept.length}-dimensional MSD along ${kept.split('').join(', ')} (MSD = 2·${kept.length}·D·t); ${dropped.join(', ')}, which does not repeat, is shown on its own and left out of D.`
    : `Periodic along ${periodicAxes.split('').join(', ')} only: D from the components asked for (${kept}), all periodic.`;
  return { components: kept, periodicAxes, note };
}

/**
 * For a group too small for atom blocks: D over the same lag window for each
 * of its atoms in each consecutive stretch of the run, and the spread of those.
 */
function withTimeBlocks(fit: DiffusionFit, atoms: Int32Array, reader: AtomSeriesReader, dt: number, dims: number[]): DiffusionFit {
  const i0 = Math.round(fit.window.startPs / dt), i1 = Math.round(fit.window.endPs / dt);
  const plan = timeSegments(reader.nFrames, i1, atoms.length);
  if (!plan || i1 - i0 < 2) return fit;
  const T = reader.nFrames, S = plan.length;
  const engine = new FftMsd(S, i1 + 1);
  const series = new Float64Array(3 * T);
  const curve = new Float64Array(i1 + 1);
  const lagPs = Float64Array.from({ length: i1 + 1 }, (_, m) => m * dt);
  const values: number[] = [];
  for (const atom of atoms) {
    reader.unwrapped(atom, series);
    for (let b = 0; b < plan.segments; b++) {
      curve.fill(0);
      for (const c of dims) engine.accumulate(series, c * T + b * S, curve);
      values.push(diffusionOverWindow(lagPs, curve, i0, i1, dims.length));
    }
  }
  return { ...fit, dStdError: diffusionUnits(blockStandardError(values)), uncertaintyMethod: 'time-blocks', uncertaintyBlocks: values.length };
}
