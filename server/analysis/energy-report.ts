/**
 * The energy analysis as a report section: headline summary, curves and
 * the methods actually used (model written out in full, conventions named).
 */
import type { AnalysisParams } from '../../shared/analysis-params.ts';
import { resolvePairsFor } from '../../shared/interaction-model.ts';
import type { EnergySummary, MeanWithError } from '../../shared/report-summary.ts';
import type { BlockAverage } from './block-average.ts';
import { energy, DEFAULT_DRIFT_THRESHOLD_KT_PER_NS, type EnergyResult } from './energy.ts';
import type { Trajectory } from './trajectory.ts';

export interface EnergySection {
  summary: EnergySummary;
  curve: [string, string, Float64Array][];
  methods: Record<string, unknown>;
}

const mean = (b: BlockAverage): MeanWithError => ({ mean: b.mean, stdError: b.stdError });

export function energySection(traj: Trajectory, params: AnalysisParams, onProgress?: (fraction: number) => void): EnergySection {
  const r = energy(traj, {
    model: params.interactionModel ?? null, fileQuantities: params.fileQuantities ?? null, masses: params.masses,
    degreesOfFreedom: params.degreesOfFreedom, constraints: params.constraints ?? undefined, removeComDrift: params.removeComDrift, ensemble: params.ensemble ?? null,
    temperatureK: params.temperatureK, externalPressureBar: params.externalPressureBar, driftThresholdKTPerNs: params.driftThresholdKTPerNs,
  }, onProgress);
  return { summary: summaryOf(r, params), curve: curveOf(r), methods: methodsOf(r, traj, params) };
}

function summaryOf(r: EnergyResult, params: AnalysisParams): EnergySummary {
  const t = r.means.pressureTensorBar;
  const h = r.heatCapacity;
  return {
    atoms: r.atoms,
    ensemble: params.ensemble ?? null,
    sources: { potential: r.sources.potential, kinetic: r.sources.kinetic, pressure: r.sources.pressure },
    potentialPerAtomEV: r.means.potentialPerAtomEV ? mean(r.means.potentialPerAtomEV) : null,
    kineticPerAtomEV: mean(r.means.kineticPerAtomEV),
    totalPerAtomEV: r.means.totalPerAtomEV ? mean(r.means.totalPerAtomEV) : null,
    temperatureK: mean(r.means.temperatureK),
    pressureBar: r.means.pressureBar ? mean(r.means.pressureBar) : null,
    pressureTensorBar: t ? { xx: mean(t[0]), yy: mean(t[1]), zz: mean(t[2]), xy: mean(t[3]), xz: mean(t[4]), yz: mean(t[5]) } : null,
    tail: r.tail,
    drift: r.drift,
    nveCheck: r.nveCheck,
    heatCapacity: h ? {
      quantity: h.quantity, method: h.method, temperatureK: h.temperatureK,
      perAtomKB: { mean: h.perAtomKB, stdError: h.perAtomKBStdError },
      jPerMolK: { mean: h.jPerMolK, stdError: h.jPerMolKStdError },
      jPerGK: { mean: h.jPerGK, stdError: h.jPerGKStdError },
    } : null,
    heatCapacityNote: h ? null : r.heatCapacityNote,
    pressureNote: r.pressureNote,
    comparisons: r.comparisons,
  };
}

function curveOf(r: EnergyResult): [string, string, Float64Array][] {
  const cols: [string, string, Float64Array][] = [['time', 'ps', r.timesPs]];
  if (r.potentialPerAtomEV) cols.push(['potential energy', 'eV/atom', r.potentialPerAtomEV]);
  cols.push(['kinetic energy', 'eV/atom', r.kineticPerAtomEV]);
  if (r.totalPerAtomEV) cols.push(['total energy', 'eV/atom', r.totalPerAtomEV]);
  cols.push(['temperature', 'K', r.temperatureK]);
  if (r.pressureBar) cols.push(['pressure', 'bar', r.pressureBar]);
  if (r.pressureTensorBar) (['xx', 'yy', 'zz', 'xy', 'xz', 'yz'] as const).forEach((c, k) => cols.push([`pressure ${c}`, 'bar', r.pressureTensorBar![k]]));
  if (r.volumeA3) cols.push(['volume', 'Å³', r.volumeA3]);
  if (r.filePotentialPerAtomEV) cols.push(['file potential energy', 'eV/atom', r.filePotentialPerAtomEV]);
  if (r.filePressureBar) cols.push(['file pressure', 'bar', r.filePressureBar]);
  return cols;
}

function methodsOf(r: EnergyResult, traj: Trajectory, params: AnalysisParams): Record<string, unknown> {
  const model = params.interactionModel;
  return {
    interactionModel: model ?? null,
    resolvedPairs: model ? resolvePairsFor(model, traj.species).map((p) => ({ ...p, ...(p.form === 'table' ? { rA: undefined, uEV: undefined, points: p.rA.length } : {}) })) : [],
    mixingRule: model ? (model.mixing === 'lorentz-berthelot' ? 'Lorentz–Berthelot for unlike LJ pairs not given: σ_ab = (σ_a + σ_b)/2, ε_ab = √(ε_a ε_b); cut-off the larger of the two, shifted if either is, tail-corrected if both are' : 'none: every pair of species present must be given') : null,
    pairSum: 'cell lists over the periodic cell (any triclinic shape), every image within the cut-off counted; open boundaries without images',
    tailCorrections: r.tail ? 'analytic, homogeneous fluid beyond the cut-off: U_tail = (2π/V)Σ N_a N_b ∫ r²u dr, P_tail = (2π/3V²)Σ N_a N_b [r_c³u(r_c) + 3∫ r²u dr]' : 'none',
    sources: r.sources,
    degreesOfFreedom: r.degreesOfFreedom,
    pressure: 'P_αβ = [(3N/f)·Σ m v_α v_β + Σ_pairs r_α F_β]/V + P_tail δ_αβ; P = trace/3 = [N k_B T + (1/3)Σ r·F]/V',
    averages: 'block averaging (Flyvbjerg–Petersen), standard error at the plateau',
    drift: 'least-squares line through total energy per atom against time; slope error widened by √g of the residuals',
    nveThreshold: { kTPerNs: params.driftThresholdKTPerNs ?? DEFAULT_DRIFT_THRESHOLD_KT_PER_NS, source: params.driftThresholdKTPerNs === undefined ? 'default: 0.01 k_B·T per atom per ns, a rule of thumb (common practice), change it to suit your run' : 'given' },
    heatCapacity: r.heatCapacity ? r.heatCapacity.method : r.heatCapacityNote,
    comparisonTolerance: 'potential energy: 1e-4 eV/atom or 0.1 % of |U|, whichever is larger; pressure: 5 bar or 1 %',
  };
}
