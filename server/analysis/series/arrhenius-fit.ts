/**
 * Arrhenius fit across the members of a series, ln D = ln D₀ − E_a/(R·T)
 * (SCIENCE item 13), by weighted least squares on 1/T with weights
 * 1/σ²(ln D), σ(ln D) = σ_D/D. With D errors the parameter errors are the
 * fit's, scaled up by √(χ²/ν) when the points scatter more than their
 * errors say (the Birge ratio, common practice), so a stated error is never
 * smaller than the scatter allows; without D errors they come from the
 * residual scatter alone. A measured temperature's error enters through
 * σ(1/T) = σ_T/T² (effective variance, see weighted-line.ts).
 */
import type { ArrheniusFitResult, ArrheniusPoint, PhaseName } from '../../../shared/series-results.ts';
import { GAS_CONSTANT_J_PER_MOL_K } from '../constants.ts';
import { diffusionUnits, energyFromJPerMol } from '../units.ts';
import { PHASE_CRITERIA } from './phase-criteria.ts';
import { fitWeightedLine } from './weighted-line.ts';

export interface ArrheniusMember {
  trajectoryId: number;
  label: string;
  temperatureK: number | null;
  temperatureStdError?: number | null;
  /** Å²/ps. */
  d: number | null;
  dStdError: number | null;
  phase: PhaseName;
  excluded: boolean;
}

function leaveOutReason(m: ArrheniusMember, sigmas: number): string | null {
  if (m.excluded) return 'excluded from fits';
  if (m.temperatureK === null || !(m.temperatureK > 0)) return 'no temperature';
  if (m.d === null) return 'no diffusion coefficient (bounded or too short MSD)';
  if (!(m.d > 0)) return 'D is not positive';
  if (m.dStdError !== null && m.dStdError > 0 && m.d <= sigmas * m.dStdError) return `D is zero within ${sigmas} standard errors`;
  return null;
}

export function fitArrhenius(members: readonly ArrheniusMember[], sigmas = PHASE_CRITERIA.mobilitySigmas): ArrheniusFitResult {
  const leftOut: ArrheniusFitResult['leftOut'] = [];
  const used: (ArrheniusMember & { temperatureK: number; d: number })[] = [];
  for (const m of members) {
    const reason = leaveOutReason(m, sigmas);
    if (reason) leftOut.push({ trajectoryId: m.trajectoryId, reason });
    else used.push(m as ArrheniusMember & { temperatureK: number; d: number });
  }
  const empty = (message: string): ArrheniusFitResult => ({
    status: 'not-enough-points', message, activationEnergy: null, activationEnergyStdError: null, d0: null, d0StdError: null,
    rangeK: null, points: [], leftOut, chiSquared: null, degreesOfFreedom: 0, errorMethod: 'none', warnings: [],
  });
  const distinctT = new Set(used.map((m) => m.temperatureK));
  if (used.length < 2 || distinctT.size < 2) {
    return empty(`An Arrhenius fit needs diffusion coefficients at two or more temperatures; ${used.length === 0 ? 'no member has' : distinctT.size < 2 && used.length > 1 ? 'all usable members share one temperature' : 'only one member has'} a usable D.`);
  }

  const n = used.length;
  const weighted = used.every((m) => m.dStdError !== null && m.dStdError > 0);
  const x = used.map((m) => 1 / m.temperatureK);
  const sigmaY = used.map((m) => (weighted ? (m.dStdError as number) / m.d : null));
  const sigmaX = used.map((m) => (m.temperatureStdError ? m.temperatureStdError / m.temperatureK ** 2 : null));
  const line = fitWeightedLine(x, used.map((m) => Math.log(m.d)), weighted ? sigmaY : null, sigmaX);
  const { slope, intercept, residuals, chiSquared } = line;
  const dof = line.degreesOfFreedom;
  const errorMethod: ArrheniusFitResult['errorMethod'] = line.errorMethod === 'point-errors' ? 'd-errors' : line.errorMethod;
  const slopeVariance = line.covariance?.bb ?? null;
  const interceptVariance = line.covariance?.aa ?? null;

  const ea = energyFromJPerMol(-slope * GAS_CONSTANT_J_PER_MOL_K);
  const eaError = slopeVariance === null ? null : energyFromJPerMol(Math.sqrt(slopeVariance) * GAS_CONSTANT_J_PER_MOL_K);
  const d0 = Math.exp(intercept);
  const points: ArrheniusPoint[] = used.map((m, i) => ({
    trajectoryId: m.trajectoryId, temperatureK: m.temperatureK, d: m.d, dStdError: m.dStdError,
    lnResidual: residuals[i], normalisedResidual: weighted ? residuals[i] / Math.hypot(sigmaY[i] as number, slope * (sigmaX[i] ?? 0)) : null,
  }));

  const warnings: string[] = [];
  const phases = new Set(used.map((m) => m.phase));
  if (phases.size > 1) {
    const byPhase = [...phases].map((p) => `${p}: ${used.filter((m) => m.phase === p).map((m) => m.label).join(', ')}`).join('; ');
    warnings.push(`The fitted points span a phase change (${byPhase}). An activation energy belongs to one phase: exclude the members of the other from the fit.`);
  } else if (phases.has('unclear')) {
    warnings.push('The phase of the fitted members is unclear; check their evidence before reading E_a as one mechanism.');
  }
  if (n === 2) warnings.push('Two points: the line passes through both, so nothing tests whether D(T) is Arrhenius-like.');
  if (chiSquared !== null && dof > 0 && chiSquared / dof > 4) {
    warnings.push(`The points scatter about the line ${Math.sqrt(chiSquared / dof).toFixed(1)} times more than their errors allow; the E_a error is scaled up to match, but D(T) may not be Arrhenius-like over this range.`);
  }
  const temperatures = used.map((m) => m.temperatureK);
  return {
    status: 'fitted',
    message: null,
    activationEnergy: { kJPerMol: ea.kJPerMol, eV: ea.eV },
    activationEnergyStdError: eaError ? { kJPerMol: eaError.kJPerMol, eV: eaError.eV } : null,
    d0: diffusionUnits(d0),
    d0StdError: interceptVariance === null ? null : diffusionUnits(d0 * Math.sqrt(interceptVariance)),
    rangeK: { min: Math.min(...temperatures), max: Math.max(...temperatures) },
    points,
    leftOut,
    chiSquared,
    degreesOfFreedom: dof,
    errorMethod,
    warnings,
  };
}
