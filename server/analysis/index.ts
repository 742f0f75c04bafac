/**
 * The engine's front door: run a set of analyses on one trajectory with one
 * validated parameter set, and return headline numbers, plottable curves and
 * the methods actually used (so a result can always be reproduced).
 */
import { ANALYSIS_KEYS, analysisParamsSchema, type AnalysisKey, type AnalysisParams, type AnalysisParamsInput } from '../../shared/analysis-params.ts';
import type { ReportSummary } from '../../shared/report-summary.ts';
import { SIMULATION_CAUTION } from '../../shared/simulation-caution.ts';
import { axesText, periodicAxesOf } from './cell-geometry.ts';
import { WAVENUMBER_PER_THZ } from './constants.ts';
import { energySection } from './energy-report.ts';
import { lindemann } from './lindemann.ts';
import { msd } from './msd.ts';
import { ngp } from './ngp.ts';
import { rdf, type RdfResult } from './rdf.ts';
import { sqFromRdf, type SqResult } from './sq.ts';
import { thermo } from './thermo.ts';
import type { Trajectory } from './trajectory.ts';
import { vacf } from './vacf.ts';
import { vdos } from './vdos.ts';

export { ANALYSIS_KEYS, type AnalysisKey };

export const ENGINE_VERSION = '0.3.0';

export interface Curve {
  columns: string[];
  units: string[];
  /** One array per column. */
  data: Float64Array[];
}

export interface AnalysisRun {
  summary: ReportSummary;
  curves: Record<string, Curve>;
  methods: Partial<Record<AnalysisKey, Record<string, unknown>>> & { params: AnalysisParams };
  caution: string;
  engineVersion: string;
}

/** What the trajectory's metadata states about the simulation; analyses take it as their defaults. */
export interface SimulationFacts {
  /** Thermostat target or the uploader's temperature, K: shown beside the kinetic one. */
  statedTemperatureK?: number | null;
  /** Holonomic constraints of the whole system (rigid bonds, frozen rotations). */
  constraints?: number | null;
}

export function runAnalyses(
  traj: Trajectory, keys: readonly AnalysisKey[], paramsInput: AnalysisParamsInput, onProgress?: (fraction: number) => void, facts: SimulationFacts = {},
): AnalysisRun {
  const asked = analysisParamsSchema.parse(paramsInput);
  // Recorded with the constraints actually used, so the parameters alone reproduce the run.
  const params: AnalysisParams = { ...asked, constraints: asked.constraints ?? facts.constraints ?? undefined };
  if (params.constraints === undefined) delete params.constraints;
  const stated = facts.statedTemperatureK ?? null;
  const wanted = ANALYSIS_KEYS.filter((k) => keys.includes(k));
  const run: AnalysisRun = { summary: {}, curves: {}, methods: { params }, caution: SIMULATION_CAUTION, engineVersion: ENGINE_VERSION };
  const species = params.species.length > 0 ? params.species : undefined;
  const masses = params.masses;
  let rdfCache: RdfResult | null = null;
  const manual = (w: AnalysisParams['fitWindow']): { startPs: number; endPs: number } | undefined =>
    w.mode === 'manual' ? { startPs: w.startPs, endPs: w.endPs } : undefined;
  const vacfOptions = { species, masses, components: params.components, maxLagPs: params.maxLagPs, removeComDrift: params.removeComDrift, gkWindowPs: manual(params.greenKuboWindow) };
  const rdfOptions = { rMaxA: params.rMaxA, binWidthA: params.binWidthA, pairs: params.pair ? [params.pair] : undefined };

  wanted.forEach((key, index) => {
    const progress = (f: number): void => onProgress?.((index + Math.min(1, f)) / wanted.length);
    switch (key) {
      case 'thermo': {
        const r = thermo(traj, { degreesOfFreedom: params.degreesOfFreedom, constraints: params.constraints, masses, removeComDrift: params.removeComDrift, statedTemperatureK: stated }, progress);
        run.summary.thermo = {
          temperatureK: { mean: r.temperature.mean, stdError: r.temperature.stdError },
          statedTemperatureK: r.statedTemperatureK,
          degreesOfFreedomRule: r.degreesOfFreedomRule,
          velocitySource: r.velocitySource,
          differenceCorrection: r.differenceCorrection,
          warnings: r.warnings,
          densityGPerCm3: r.density ? { mean: r.density.mean, stdError: r.density.stdError } : null,
          degreesOfFreedom: r.degreesOfFreedom,
          equilibrated: r.equilibration.equilibrated,
          // Counted from the start of the chosen range, as discardPs is, so it can be given as it stands next time.
          suggestedDiscardPs: r.equilibration.settlesAfter ? (params.discardPs ?? 0) + r.equilibration.settlesAfter.ps : null,
        };
        const cols: [string, string, Float64Array][] = [
          ['time', 'ps', r.timesPs],
          ['temperature', 'K', r.temperatureK],
          ['kinetic energy', 'eV', r.kineticEnergyEV],
        ];
        if (r.densityGPerCm3) cols.push(['density', 'g/cm³', r.densityGPerCm3]);
        run.curves.thermo = curve(cols);
        run.methods.thermo = { degreesOfFreedom: r.degreesOfFreedom, degreesOfFreedomRule: r.degreesOfFreedomRule, statedTemperatureK: r.statedTemperatureK, velocitySource: r.velocitySource, differenceCorrection: r.differenceCorrection, blockingPlateauLevel: r.temperature.plateauLevel, equilibration: r.equilibration };
        break;
      }
      case 'msd': {
        const r = msd(traj, { species, masses, components: params.components, maxLagPs: params.maxLagPs, fitWindowPs: manual(params.fitWindow), removeComDrift: params.removeComDrift }, progress);
        run.summary.msd = {
          dimensions: r.dimensions,
          components: r.components,
          partlyPeriodic: r.partlyPeriodic ? { periodicAxes: r.partlyPeriodic.periodicAxes, note: r.partlyPeriodic.note } : null,
          groups: r.groups.map(({ label, nAtoms, diffusion: f }) => ({
            label, atoms: nAtoms, regime: f.regime, d: f.d, dStdError: f.dStdError, uncertaintyMethod: f.uncertaintyMethod, uncertaintyBlocks: f.uncertaintyBlocks,
            slopeExponent: f.slopeExponent, fitWindowPs: { start: f.window.startPs, end: f.window.endPs, source: f.window.source }, plateauA2: f.plateauA2,
          })),
        };
        const perAxis = r.partlyPeriodic ? r.partlyPeriodic.perAxisA2.map((a, k): [string, string, Float64Array] => [`MSD along ${'xyz'[k]}`, 'Å²', a]) : [];
        run.curves.msd = curve([['lag', 'ps', r.lagPs], ...r.groups.map((g): [string, string, Float64Array] => [`MSD ${g.label}`, 'Å²', g.msdA2]), ...perAxis]);
        run.methods.msd = { unwrapped: r.unwrapped, comDriftRemoved: r.comDriftRemoved, dimensions: r.dimensions, components: r.components, periodicAxes: r.partlyPeriodic?.periodicAxes ?? null, fits: r.groups.map((g) => ({ group: g.label, window: g.diffusion.window, uncertainty: g.diffusion.uncertaintyMethod, blocks: g.diffusion.uncertaintyBlocks })) };
        break;
      }
      case 'vacf': {
        const v = vacf(traj, vacfOptions, progress);
        run.summary.vacf = {
          velocitySource: v.velocitySource,
          groups: v.groups.map(({ label, nAtoms, greenKubo: gk }) => ({
            label, atoms: nAtoms, dGreenKubo: gk.d, dStdError: gk.dStdError, uncertaintyMethod: gk.uncertaintyMethod, uncertaintyBlocks: gk.uncertaintyBlocks,
            spread: gk.dSpread, converged: gk.converged,
            plateauWindowPs: { start: gk.window.startPs, end: gk.window.endPs, source: gk.window.source },
          })),
        };
        run.curves.vacf = curve([
          ['lag', 'ps', v.lagPs],
          ...v.groups.flatMap((g): [string, string, Float64Array][] => [
            [`VACF ${g.label}`, 'Å²/ps²', g.vacfA2PerPs2],
            [`normalised VACF ${g.label}`, '1', g.normalised],
            [`running D ${g.label}`, 'Å²/ps', g.runningDA2PerPs],
          ]),
        ]);
        run.methods.vacf = { velocitySource: v.velocitySource, comDriftRemoved: v.comDriftRemoved, plateaus: v.groups.map((g) => ({ group: g.label, window: g.greenKubo.window, uncertainty: g.greenKubo.uncertaintyMethod, blocks: g.greenKubo.uncertaintyBlocks })) };
        break;
      }
      case 'vdos': {
        const r = vdos(traj, {
          ...vacfOptions, window: params.window, zeroPadFactor: params.zeroPadFactor, degreesOfFreedom: params.degreesOfFreedom, constraints: params.constraints,
          thermoTemperatureK: params.temperatureK, statedTemperatureK: stated,
        }, progress);
        const all = r.groups[0];
        const { quantum, classical } = r.thermo;
        const cv = (h: typeof quantum) => ({ perAtomKB: h.cvPerAtomKB, jPerMolK: h.cvJPerMolK, jPerGK: h.cvJPerGK });
        const entropy = (h: typeof quantum) => ({ perAtomKB: h.entropyPerAtomKB, jPerMolK: h.entropyJPerMolK });
        const dc = r.differenceCorrection;
        run.summary.vdos = {
          temperatureK: r.thermo.temperatureK,
          temperatureSource: r.temperature.source,
          kineticTemperatureK: all.kineticTemperatureK,
          statedTemperatureK: r.temperature.statedK,
          temperatureWarning: r.temperature.warning,
          degreesOfFreedom: all.degreesOfFreedom,
          degreesOfFreedomRule: r.degreesOfFreedomRule,
          velocitySource: r.velocitySource,
          differenceCorrection: dc ? { correctedUpToCm1: dc.correctedUpToThz * WAVENUMBER_PER_THZ, uncorrectableFraction: dc.uncorrectableFraction, factor: dc.correctedOverRaw } : null,
          warnings: r.warnings,
          peaks: all.peaks.slice(0, 5).map((p, i) => {
            const se = r.errors?.peakThz[i];
            return { thz: p.thz, cm1: p.cm1, meV: p.meV, fwhmCm1: p.fwhmCm1, cm1StdError: se === null || se === undefined ? null : se * WAVENUMBER_PER_THZ };
          }),
          stdErrors: r.errors ? {
            blocks: r.errors.blocks, kineticTemperatureK: r.errors.kineticTemperatureK, cvPerAtomKB: r.errors.cvPerAtomKB,
            entropyPerAtomKB: r.errors.entropyPerAtomKB, zeroPointEvPerAtom: r.errors.zeroPointPerAtomEV,
          } : null,
          cv: { quantum: cv(quantum), classical: cv(classical) },
          entropy: { quantum: entropy(quantum), classical: entropy(classical) },
          zeroPoint: { evPerAtom: quantum.zeroPointPerAtomEV, kJPerMol: quantum.zeroPointKJPerMol },
          modes: r.thermo.modes,
        };
        run.curves.vdos = curve([
          ['frequency', 'THz', r.freqTHz],
          ['wavenumber', 'cm⁻¹', r.freqCm1],
          ['energy', 'meV', r.freqMeV],
          ...r.groups.map((g): [string, string, Float64Array] => [`VDOS ${g.label}`, 'modes/THz', g.dosPerThz]),
        ]);
        run.methods.vdos = {
          method: r.method, window: r.window, fftLength: r.fftLength, segmentFrames: r.segmentFrames, segments: r.segments, binWidthThz: r.binWidthThz,
          degreesOfFreedom: all.degreesOfFreedom, degreesOfFreedomRule: r.degreesOfFreedomRule, temperature: r.temperature,
          velocitySource: r.velocitySource, differenceCorrection: dc, thermoNote: r.thermoNote,
        };
        break;
      }
      case 'rdf':
      case 'sq': {
        const refused = structureRefusal(traj);
        if (refused) {
          // Said on the card and in the methods; the other analyses of the run go on.
          if (key === 'rdf') run.summary.rdf = { pairs: [], refused };
          else run.summary.sq = { firstPeak: null, refused };
          run.methods[key] = { refused };
          break;
        }
        rdfCache ??= rdf(traj, rdfOptions, progress);
        const r = rdfCache;
        if (key === 'rdf') {
          run.summary.rdf = {
            pairs: [r.total, ...r.pairs].map((p) => ({
              label: p.label,
              firstPeak: p.firstPeak ? { rA: p.firstPeak.rA, g: p.firstPeak.g } : null,
              firstMinimum: p.firstMinimum ? { rA: p.firstMinimum.rA, coordination: p.firstMinimum.coordination } : null,
            })),
          };
          run.curves.rdf = curve([
            ['r', 'Å', r.rA],
            ...[r.total, ...r.pairs].flatMap((p): [string, string, Float64Array][] => [
              [`g ${p.label}`, '1', p.g],
              [`N ${p.label}`, 'atoms', p.coordination],
            ]),
          ]);
          run.methods.rdf = { rMaxA: r.rMaxA, binWidthA: r.binWidthA, framesUsed: r.framesUsed, independentFrames: r.independentFrames, method: r.method, normalisation: r.normalisation };
        } else {
          const q = sqFromRdf(r, { sqWindow: params.sqWindow, qMaxInvA: params.qMaxInvA });
          run.summary.sq = { firstPeak: highestReliablePeak(q) };
          run.curves.sq = curve([['q', 'Å⁻¹', q.qInvA], ['S(q)', '1', q.s]]);
          run.methods.sq = { window: q.window, qReliableFromInvA: q.qReliableFromInvA, rMaxA: r.rMaxA };
        }
        break;
      }
      case 'lindemann': {
        const r = lindemann(traj, { species, masses }, progress);
        run.summary.lindemann = { index: r.index, form: r.form, melted: r.melted, threshold: r.threshold, displacementRatio: r.displacementRatio, nearestNeighbourA: r.nearestNeighbourA };
        run.curves.lindemann = curve([['atom', 'index', Float64Array.from(r.atoms)], ['Lindemann index', '1', r.perAtom]]);
        run.methods.lindemann = { form: r.form, pairs: r.pairs, frameStride: r.frameStride, framesUsed: r.framesUsed, nearestNeighbourA: r.nearestNeighbourA, rmsDisplacementA: r.rmsDisplacementA };
        break;
      }
      case 'energy': {
        const r = energySection(traj, params, progress);
        run.summary.energy = r.summary;
        run.curves.energy = curve(r.curve);
        run.methods.energy = r.methods;
        break;
      }
      case 'ngp': {
        const r = ngp(traj, { species, masses, components: params.components, maxLagPs: params.maxLagPs, removeComDrift: params.removeComDrift }, progress);
        const groups = r.groups.map((g) => ({ label: g.label, atoms: g.nAtoms, peakLagPs: g.peak?.lagPs ?? null, peakAlpha2: g.peak?.alpha2 ?? null }));
        const single = groups.length === 1 ? groups[0] : null;
        run.summary.ngp = { peakLagPs: single?.peakLagPs ?? null, peakAlpha2: single?.peakAlpha2 ?? null, groups };
        run.curves.ngp = curve([
          ['lag', 'ps', r.lagPs],
          ...r.groups.flatMap((g): [string, string, Float64Array][] => [[`alpha2 ${g.label}`, '1', g.alpha2], [`MSD ${g.label}`, 'Å²', g.msdA2]]),
        ]);
        run.methods.ngp = { originStride: r.originStride };
        break;
      }
    }
    onProgress?.((index + 1) / wanted.length);
  });
  return run;
}

/**
 * Why g(r) and S(q) cannot be computed for this trajectory, or null. Their
 * ideal-gas normalisation counts pairs against a uniform density filling a
 * cell that repeats in all three directions; without one that density is not
 * defined, and in a slab the vacuum or walls along the normal would pull g(r)
 * below 1 at large r for that reason alone. Rather than a curve that looks
 * right and is not, no curve.
 */
export function structureRefusal(traj: Trajectory): string | null {
  const axes = periodicAxesOf(traj);
  if (!traj.cells || !axes.some(Boolean)) {
    return 'g(r) needs a cell periodic in all three directions for its ideal-gas normalisation; this trajectory has no periodic cell (boundary: ' + traj.boundary + '), so the density to divide by is not defined.';
  }
  if (!axes.every(Boolean)) {
    const open = axesText(axes.map((p) => !p));
    return `g(r) is not computed for a system periodic along ${axesText(axes)} only: its ideal-gas normalisation assumes atoms fill a cell repeating in all three directions, ` +
      `while along ${open} this one is bounded by walls or vacuum, which would pull g(r) below 1 at large r for that reason alone. Analyse a bulk region, or a fully periodic run.`;
  }
  return null;
}

/** The main peak of S(q) above the q where the finite r_max stops dominating. */
function highestReliablePeak(q: SqResult): { qInvA: number; s: number } | null {
  let peak = -1;
  for (let i = 0; i < q.s.length; i++) if (q.qInvA[i] >= q.qReliableFromInvA && (peak < 0 || q.s[i] > q.s[peak])) peak = i;
  return peak < 0 ? null : { qInvA: q.qInvA[peak], s: q.s[peak] };
}

function curve(columns: [string, string, Float64Array][]): Curve {
  return { columns: columns.map((c) => c[0]), units: columns.map((c) => c[1]), data: columns.map((c) => c[2]) };
}
