import { analysisParamsSchema, type AnalysisParamsInput, type SpectralWindow, type SqWindow } from '../../../shared/analysis-params';

/** The advanced panel's raw values: blanks are null, windows are split into mode and bounds. */
export interface AdvancedSettings {
  /**
   * Frame range as people count it, from 1 like the viewer and cut files: the first and the last frame used,
   * both included. Blanks mean from the start and to the end. buildParams turns them into the API's 0-based,
   * end-exclusive range, the one place the two counts meet.
   */
  fromFrame: number | null;
  toFrame: number | null;
  /** Blank means the automatic stride. */
  frameStride: number | null;
  /** Equilibration left out at the start of the range, ps. */
  discardPs: number | null;
  species: string[];
  maxLagPs: number | null;
  removeComDrift: boolean;
  fitMode: 'auto' | 'manual';
  fitStartPs: number | null;
  fitEndPs: number | null;
  gkMode: 'auto' | 'manual';
  gkStartPs: number | null;
  gkEndPs: number | null;
  window: SpectralWindow;
  zeroPadFactor: number;
  temperatureK: number | null;
  degreesOfFreedom: number | null;
  /** Null: the constraints stated with the trajectory. */
  constraints: number | null;
  rMaxA: number | null;
  binWidthA: number;
  /** "A–B" or null for every pair. */
  pair: string | null;
  sqWindow: SqWindow;
  /** NVE drift threshold, k_B·T per atom per ns; null for the default. */
  driftThresholdKTPerNs?: number | null;
  /** Barostat pressure for the NPT enthalpy, bar; null for the mean virial pressure. */
  externalPressureBar?: number | null;
}

const given = (v: number | null | undefined): v is number => v !== null && v !== undefined && !Number.isNaN(v);

/** Turns the panel into the API's parameters, with plain-words problems for half-filled windows. */
export function buildParams(s: AdvancedSettings): { params: AnalysisParamsInput; problems: string[] } {
  const problems: string[] = [];
  const window = (mode: 'auto' | 'manual', start: number | null, end: number | null, what: string) => {
    if (mode === 'auto') return { mode: 'auto' as const };
    if (!given(start) || !given(end)) {
      problems.push(`Give both ends of the ${what}, in ps.`);
      return { mode: 'auto' as const };
    }
    return { mode: 'manual' as const, startPs: start, endPs: end };
  };
  const params: AnalysisParamsInput = {
    species: s.species,
    removeComDrift: s.removeComDrift,
    fitWindow: window(s.fitMode, s.fitStartPs, s.fitEndPs, 'diffusion fit window'),
    greenKuboWindow: window(s.gkMode, s.gkStartPs, s.gkEndPs, 'Green–Kubo plateau window'),
    window: s.window,
    zeroPadFactor: s.zeroPadFactor,
    binWidthA: s.binWidthA,
    sqWindow: s.sqWindow,
  };
  // Frame n counted from 1 is index n − 1; the last frame n, included, is the exclusive end n.
  if (given(s.fromFrame)) params.fromFrame = s.fromFrame - 1;
  if (given(s.toFrame)) params.toFrame = s.toFrame;
  if (given(s.frameStride)) params.frameStride = s.frameStride;
  if (given(s.discardPs) && s.discardPs > 0) params.discardPs = s.discardPs;
  if (given(s.maxLagPs)) params.maxLagPs = s.maxLagPs;
  if (given(s.temperatureK)) params.temperatureK = s.temperatureK;
  if (given(s.degreesOfFreedom)) params.degreesOfFreedom = s.degreesOfFreedom;
  if (given(s.constraints)) params.constraints = s.constraints;
  if (given(s.rMaxA)) params.rMaxA = s.rMaxA;
  if (given(s.driftThresholdKTPerNs)) params.driftThresholdKTPerNs = s.driftThresholdKTPerNs;
  if (given(s.externalPressureBar)) params.externalPressureBar = s.externalPressureBar;
  if (s.pair) {
    const [a, b] = s.pair.split('–');
    if (a && b) params.pair = [a, b];
  }
  return { params, problems };
}

const number = (v: unknown): number | null => (typeof v === 'number' && Number.isFinite(v) ? v : null);

/** The panel filled from a run's stored parameters, for running again with changes; unknown values fall back to `base`. */
export function settingsFromParams(params: Record<string, unknown>, base: AdvancedSettings): AdvancedSettings {
  const parsed = analysisParamsSchema.safeParse(params);
  if (!parsed.success) return base;
  const p = parsed.data;
  const manual = (w: typeof p.fitWindow) => (w.mode === 'manual' ? { mode: 'manual' as const, start: w.startPs, end: w.endPs } : { mode: 'auto' as const, start: null, end: null });
  const fit = manual(p.fitWindow);
  const gk = manual(p.greenKuboWindow);
  return {
    ...base,
    fromFrame: p.fromFrame > 0 ? p.fromFrame + 1 : null, toFrame: number(p.toFrame), frameStride: number(p.frameStride),
    discardPs: p.discardPs > 0 ? p.discardPs : null,
    species: p.species, maxLagPs: number(p.maxLagPs), removeComDrift: p.removeComDrift,
    fitMode: fit.mode, fitStartPs: fit.start, fitEndPs: fit.end, gkMode: gk.mode, gkStartPs: gk.start, gkEndPs: gk.end,
    window: p.window, zeroPadFactor: p.zeroPadFactor, temperatureK: number(p.temperatureK), degreesOfFreedom: number(p.degreesOfFreedom),
    constraints: number(p.constraints), rMaxA: number(p.rMaxA), binWidthA: p.binWidthA, pair: p.pair ? p.pair.join('–') : null, sqWindow: p.sqWindow,
    driftThresholdKTPerNs: number(p.driftThresholdKTPerNs), externalPressureBar: number(p.externalPressureBar),
  };
}
