/**
 * Analysis settings as the browser sends them and the server runs them: one
 * zod schema, so both sides accept and reject exactly the same input.
 */
import { z } from 'zod';
import { fileQuantitiesSchema } from './file-quantities.ts';
import { interactionModelSchema } from './interaction-model.ts';

export const ANALYSIS_KEYS = ['thermo', 'msd', 'vacf', 'vdos', 'rdf', 'lindemann', 'ngp', 'sq', 'energy'] as const;
export type AnalysisKey = (typeof ANALYSIS_KEYS)[number];
export const analysisKeySchema = z.enum(ANALYSIS_KEYS);

export const SPECTRAL_WINDOWS = ['hann', 'none', 'blackman', 'gaussian'] as const;
export type SpectralWindow = (typeof SPECTRAL_WINDOWS)[number];

export const SQ_WINDOWS = ['lorch', 'none'] as const;
export type SqWindow = (typeof SQ_WINDOWS)[number];

export const COMPONENT_SETS = ['xyz', 'xy', 'xz', 'yz', 'x', 'y', 'z'] as const;
export type ComponentSet = (typeof COMPONENT_SETS)[number];

/** g(r)'s default range reaches at most the radius that holds about this many atoms at the mean density (server/run-plan/rdf-range.ts). */
export const DEFAULT_RDF_SPHERE_ATOMS = 1000;

/**
 * Bounds on every setting, so a value that would make a job run for hours,
 * a report of hundreds of megabytes or a typed-array error is refused with
 * 400 before any job starts. They are generous for real systems: 1 ms of
 * simulated time, 10 000 Å, 20 000 bins.
 */
export const PARAM_LIMITS = {
  maxTimePs: 1e9,
  maxLengthA: 10_000,
  minBinWidthA: 0.005,
  maxBins: 20_000,
  maxSpecies: 64,
  maxLabelLength: 32,
  maxTemperatureK: 1e6,
  maxDegreesOfFreedom: 3e9,
  maxMassU: 1e6,
} as const;

const label = z.string().min(1).max(PARAM_LIMITS.maxLabelLength, `must be at most ${PARAM_LIMITS.maxLabelLength} characters`);
const timePs = z.number().max(PARAM_LIMITS.maxTimePs, `must be at most ${PARAM_LIMITS.maxTimePs} ps`);

const timeWindow = z
  .object({ startPs: timePs.nonnegative(), endPs: timePs.positive() })
  .refine((w) => w.endPs > w.startPs, { message: 'The window must end after it starts.' });

/** Fit window for D: automatic, or start/end in ps. */
export const fitWindowSchema = z.union([z.object({ mode: z.literal('auto') }), z.object({ mode: z.literal('manual') }).and(timeWindow)]);
export type FitWindow = z.infer<typeof fitWindowSchema>;

export const analysisParamsSchema = z.object({
  /** First frame analysed, 0-based (see shared/frame-selection.ts). */
  fromFrame: z.number().int().nonnegative().default(0),
  /** One past the last frame analysed; absent means to the end. */
  toFrame: z.number().int().positive().optional(),
  /** Every n-th frame; absent means 1, or more for runs longer than 100 000 frames. */
  frameStride: z.number().int().positive().max(1_000_000).optional(),
  /** Time left out at the start of the range for equilibration, ps. */
  discardPs: z.number().nonnegative().max(1e9).default(0),
  /** Species to include; empty means all. */
  species: z.array(label).max(PARAM_LIMITS.maxSpecies, `must list at most ${PARAM_LIMITS.maxSpecies} species`).default([]),
  /** Species pair for g(r) beside the total; absent means every pair. */
  pair: z.tuple([label, label]).optional(),
  components: z.enum(COMPONENT_SETS).default('xyz'),
  maxLagPs: timePs.positive().optional(),
  fitWindow: fitWindowSchema.default({ mode: 'auto' }),
  greenKuboWindow: fitWindowSchema.default({ mode: 'auto' }),
  window: z.enum(SPECTRAL_WINDOWS).default('hann'),
  zeroPadFactor: z.number().int().min(1).max(16).default(1),
  rMaxA: z.number().min(0.1, 'must be at least 0.1 Å').max(PARAM_LIMITS.maxLengthA, `must be at most ${PARAM_LIMITS.maxLengthA} Å`).optional(),
  binWidthA: z.number().min(PARAM_LIMITS.minBinWidthA, `must be at least ${PARAM_LIMITS.minBinWidthA} Å`).max(1, 'must be at most 1 Å').default(0.05),
  sqWindow: z.enum(SQ_WINDOWS).default('lorch'),
  qMaxInvA: z.number().min(0.1, 'must be at least 0.1 Å⁻¹').max(100, 'must be at most 100 Å⁻¹').optional(),
  /** Temperature for heat capacity, entropy and zero-point energy; default the kinetic temperature. */
  temperatureK: z.number().positive().max(PARAM_LIMITS.maxTemperatureK, `must be at most ${PARAM_LIMITS.maxTemperatureK} K`).optional(),
  /** Total degrees of freedom; default 3N − constraints − 3 (centre of mass removed). */
  degreesOfFreedom: z.number().int().positive().max(PARAM_LIMITS.maxDegreesOfFreedom).optional(),
  /** Holonomic constraints of the whole system; absent means those stated with the trajectory (else 0). */
  constraints: z.number().int().nonnegative().max(PARAM_LIMITS.maxDegreesOfFreedom).optional(),
  removeComDrift: z.boolean().default(true),
  /** Mass overrides in u, by species label or element symbol. */
  masses: z.record(label, z.number().positive().max(PARAM_LIMITS.maxMassU, `must be at most ${PARAM_LIMITS.maxMassU} u`))
    .refine((m) => Object.keys(m).length <= PARAM_LIMITS.maxSpecies, `must give at most ${PARAM_LIMITS.maxSpecies} masses`).default({}),
  /** Pair potentials for the energy analysis; by default the trajectory's (or its project's) stored model. */
  interactionModel: interactionModelSchema.optional(),
  /** Which per-frame file numbers are energies, pressure, temperature; by default the trajectory's metadata. */
  fileQuantities: fileQuantitiesSchema.optional(),
  /** Ensemble of the run (chooses the fluctuation formula); by default the trajectory's metadata. */
  ensemble: z.enum(['NVE', 'NVT', 'NPT', 'other']).optional(),
  /** NVE drift threshold in k_B·T per atom per ns (default 0.01, a rule of thumb). */
  driftThresholdKTPerNs: z.number().positive().max(1000).optional(),
  /** Barostat pressure for the NPT enthalpy, bar; default the mean virial pressure. */
  externalPressureBar: z.number().min(-1e7).max(1e7).optional(),
}).refine((p) => p.rMaxA === undefined || p.rMaxA / p.binWidthA <= PARAM_LIMITS.maxBins, {
  message: `rMaxA / binWidthA must be at most ${PARAM_LIMITS.maxBins} bins: widen the bins or shorten the range`, path: ['binWidthA'],
});

/** Parsed settings, defaults filled in. */
export type AnalysisParams = z.infer<typeof analysisParamsSchema>;
/** What a caller may send. */
export type AnalysisParamsInput = z.input<typeof analysisParamsSchema>;
