/**
 * The engine's front door: run a set of analyses on one trajectory with one
 * validated parameter set, and return headline numbers, plottable curves and
 * the methods actually used (so a result can always be reproduced).
 */
import { ANALYSIS_KEYS, analysisParamsSchema, type AnalysisKey, type AnalysisParams, type AnalysisParamsInput } from '../../shared/analysis-params.ts';
import { SIMULATION_CAUTION } from '../../shared/simulation-caution.ts';
import { lindemann } from './lindemann.ts';
import { msd } from './msd.ts';
import { ngp } from './ngp.ts';
import { rdf, type RdfResult } from './rdf.ts';
import { sqFromRdf } from './sq.ts';
import { thermo } from './thermo.ts';
import type { Trajectory } from './trajectory.ts';
import { vacf, type VacfResult } from './vacf.ts';
import { vdosFromVacf } from './vdos.ts';

export { ANALYSIS_KEYS, type AnalysisKey };

export const ENGINE_VERSION = '0.1.0';

export interface Curve {
  columns: string[];
  units: string[];
  /** One array per column. */
  data: Float64Array[];
}

export type Headline = Record<string, number | string | boolean | null>;

export interface AnalysisRun {
  summary: Partial<Record<AnalysisKey, Headline>>;
  curves: Record<string, Curve>;
  methods: Partial<Record<AnalysisKey, Record<string, unknown>>> & { params: AnalysisParams };
  caution: string;
  engineVersion: string;
}

export function runAnalyses(traj: Trajectory, keys: readonly AnalysisKey[], paramsInput: AnalysisParamsInput, onProgress?: (fraction: number) => void): AnalysisRun {
  const params = analysisParamsSchema.parse(paramsInput);
  const wanted = ANALYSIS_KEYS.filter((k) => keys.includes(k));
  const run: AnalysisRun = { summary: {}, curves: {}, methods: { params }, caution: SIMULATION_CAUTION, engineVersion: ENGINE_VERSION };
  const species = params.species.length > 0 ? params.species : undefined;
  const masses = params.masses;
  let vacfCache: VacfResult | null = null;
  let rdfCache: RdfResult | null = null;
  const manual = (w: AnalysisParams['fitWindow']): { startPs: number; endPs: number } | undefined =>
    w.mode === 'manual' ? { startPs: w.startPs, endPs: w.endPs } : undefined;
  const vacfOptions = { species, masses, components: params.components, maxLagPs: params.maxLagPs, removeComDrift: params.removeComDrift, gkWindowPs: manual(params.greenKuboWindow) };
  const rdfOptions = { rMaxA: params.rMaxA, binWidthA: params.binWidthA, pairs: params.pair ? [params.pair] : undefined };

  wanted.forEach((key, index) => {
    const progress = (f: number): void => onProgress?.((index + Math.min(1, f)) / wanted.length);
    switch (key) {
      case 'thermo': {
        const r = thermo(traj, { degreesOfFreedom: params.degreesOfFreedom, constraints: params.constraints, masses }, progress);
        run.summary.thermo = {
          temperatureK: r.temperature.mean,
          temperatureStdErrorK: r.temperature.stdError,
          densityGPerCm3: r.density?.mean ?? null,
          densityStdErrorGPerCm3: r.density?.stdError ?? null,
          equilibrated: r.equilibration.equilibrated,
        };
        const cols: [string, string, Float64Array][] = [
          ['time', 'ps', r.timesPs],
          ['temperature', 'K', r.temperatureK],
          ['kinetic energy', 'eV', r.kineticEnergyEV],
        ];
        if (r.densityGPerCm3) cols.push(['density', 'g/cm³', r.densityGPerCm3]);
        run.curves.thermo = curve(cols);
        run.methods.thermo = { degreesOfFreedom: r.degreesOfFreedom, velocitySource: r.velocitySource, blockingPlateauLevel: r.temperature.plateauLevel, equilibration: r.equilibration };
        break;
      }
      case 'msd': {
        const r = msd(traj, { species, masses, components: params.components, maxLagPs: params.maxLagPs, fitWindowPs: manual(params.fitWindow), removeComDrift: params.removeComDrift }, progress);
        const s: Headline = {};
        for (const g of r.groups) {
          s[`${g.label}.regime`] = g.diffusion.regime;
          s[`${g.label}.D_1e-9m2/s`] = g.diffusion.d?.e9M2PerS ?? null;
          s[`${g.label}.Derr_1e-9m2/s`] = g.diffusion.dStdError?.e9M2PerS ?? null;
          s[`${g.label}.slopeExponent`] = g.diffusion.slopeExponent;
          s[`${g.label}.plateau_A2`] = g.diffusion.plateauA2;
        }
        run.summary.msd = s;
        run.curves.msd = curve([['lag', 'ps', r.lagPs], ...r.groups.map((g): [string, string, Float64Array] => [`MSD ${g.label}`, 'Å²', g.msdA2])]);
        run.methods.msd = { unwrapped: r.unwrapped, comDriftRemoved: r.comDriftRemoved, dimensions: r.dimensions, fits: r.groups.map((g) => ({ group: g.label, window: g.diffusion.window, uncertainty: g.diffusion.uncertaintyMethod })) };
        break;
      }
      case 'vacf':
      case 'vdos': {
        vacfCache ??= vacf(traj, vacfOptions, progress);
        const v = vacfCache;
        if (key === 'vacf') {
          const s: Headline = {};
          for (const g of v.groups) {
            s[`${g.label}.D_GK_1e-9m2/s`] = g.greenKubo.d.e9M2PerS;
            s[`${g.label}.D_GK_spread_1e-9m2/s`] = g.greenKubo.dSpread.e9M2PerS;
            s[`${g.label}.converged`] = g.greenKubo.converged;
          }
          run.summary.vacf = s;
          run.curves.vacf = curve([
            ['lag', 'ps', v.lagPs],
            ...v.groups.flatMap((g): [string, string, Float64Array][] => [
              [`VACF ${g.label}`, 'Å²/ps²', g.vacfA2PerPs2],
              [`normalised VACF ${g.label}`, '1', g.normalised],
              [`running D ${g.label}`, 'Å²/ps', g.runningDA2PerPs],
            ]),
          ]);
          run.methods.vacf = { velocitySource: v.velocitySource, comDriftRemoved: v.comDriftRemoved, plateaus: v.groups.map((g) => ({ group: g.label, window: g.greenKubo.window })) };
        } else {
          const r = vdosFromVacf(v, traj, { window: params.window, zeroPadFactor: params.zeroPadFactor, degreesOfFreedom: params.degreesOfFreedom, thermoTemperatureK: params.temperatureK });
          const all = r.groups[0];
          const s: Headline = { temperatureK: r.thermo.temperatureK };
          all.peaks.slice(0, 5).forEach((p, i) => {
            s[`peak${i + 1}_cm-1`] = p.cm1;
            s[`peak${i + 1}_fwhm_cm-1`] = p.fwhmCm1;
          });
          Object.assign(s, {
            cv_quantum_kB_per_atom: r.thermo.quantum.cvPerAtomKB,
            cv_classical_kB_per_atom: r.thermo.classical.cvPerAtomKB,
            cv_quantum_J_per_molK: r.thermo.quantum.cvJPerMolK,
            cv_quantum_J_per_gK: r.thermo.quantum.cvJPerGK,
            entropy_quantum_kB_per_atom: r.thermo.quantum.entropyPerAtomKB,
            entropy_classical_kB_per_atom: r.thermo.classical.entropyPerAtomKB,
            zpe_eV_per_atom: r.thermo.quantum.zeroPointPerAtomEV,
          });
          run.summary.vdos = s;
          run.curves.vdos = curve([
            ['frequency', 'THz', r.freqTHz],
            ['wavenumber', 'cm⁻¹', r.freqCm1],
            ['energy', 'meV', r.freqMeV],
            ...r.groups.map((g): [string, string, Float64Array] => [`VDOS ${g.label}`, 'modes/THz', g.dosPerThz]),
          ]);
          run.methods.vdos = { window: r.window, fftLength: r.fftLength, binWidthThz: r.binWidthThz, degreesOfFreedom: all.degreesOfFreedom, velocitySource: r.velocitySource, thermoNote: r.thermoNote };
        }
        break;
      }
      case 'rdf':
      case 'sq': {
        rdfCache ??= rdf(traj, rdfOptions, progress);
        const r = rdfCache;
        if (key === 'rdf') {
          const s: Headline = {};
          for (const p of [r.total, ...r.pairs]) {
            s[`${p.label}.firstPeak_A`] = p.firstPeak?.rA ?? null;
            s[`${p.label}.firstPeak_g`] = p.firstPeak?.g ?? null;
            s[`${p.label}.firstMinimum_A`] = p.firstMinimum?.rA ?? null;
            s[`${p.label}.coordination`] = p.firstMinimum?.coordination ?? null;
          }
          run.summary.rdf = s;
          run.curves.rdf = curve([
            ['r', 'Å', r.rA],
            ...[r.total, ...r.pairs].flatMap((p): [string, string, Float64Array][] => [
              [`g ${p.label}`, '1', p.g],
              [`N ${p.label}`, 'atoms', p.coordination],
            ]),
          ]);
          run.methods.rdf = { rMaxA: r.rMaxA, binWidthA: r.binWidthA, framesUsed: r.framesUsed, method: r.method, normalisation: r.normalisation };
        } else {
          const q = sqFromRdf(r, { sqWindow: params.sqWindow, qMaxInvA: params.qMaxInvA });
          let peak = 0;
          for (let i = 0; i < q.s.length; i++) if (q.qInvA[i] >= q.qReliableFromInvA && (peak === 0 || q.s[i] > q.s[peak])) peak = i;
          run.summary.sq = { firstPeak_invA: q.qInvA[peak] ?? null, firstPeak_S: q.s[peak] ?? null };
          run.curves.sq = curve([['q', 'Å⁻¹', q.qInvA], ['S(q)', '1', q.s]]);
          run.methods.sq = { window: q.window, qReliableFromInvA: q.qReliableFromInvA, rMaxA: r.rMaxA };
        }
        break;
      }
      case 'lindemann': {
        const r = lindemann(traj, { species }, progress);
        run.summary.lindemann = { index: r.index, melted: r.melted, threshold: r.threshold, displacementRatio: r.displacementRatio };
        run.curves.lindemann = curve([['atom', 'index', Float64Array.from(r.atoms)], ['Lindemann index', '1', r.perAtom]]);
        run.methods.lindemann = { pairSet: r.pairSet, pairs: r.pairs, frameStride: r.frameStride, framesUsed: r.framesUsed };
        break;
      }
      case 'ngp': {
        const r = ngp(traj, { species, masses, components: params.components, maxLagPs: params.maxLagPs, removeComDrift: params.removeComDrift }, progress);
        run.summary.ngp = { peakLagPs: r.peak?.lagPs ?? null, peakAlpha2: r.peak?.alpha2 ?? null };
        run.curves.ngp = curve([['lag', 'ps', r.lagPs], ['alpha2', '1', r.alpha2], ['MSD', 'Å²', r.msdA2]]);
        run.methods.ngp = { originStride: r.originStride };
        break;
      }
    }
    onProgress?.((index + 1) / wanted.length);
  });
  return run;
}

function curve(columns: [string, string, Float64Array][]): Curve {
  return { columns: columns.map((c) => c[0]), units: columns.map((c) => c[1]), data: columns.map((c) => c[2]) };
}
