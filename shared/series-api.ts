/**
 * The series API: request bodies and answers of /api/projects/:id/series,
 * /api/series/:id and the series' links and comments. One set of zod schemas
 * that the server parses and answers with and the browser app unwraps with.
 *
 * The results block mirrors what the engine derives (shared/series-results.ts);
 * a compile-time check at the end keeps the two from drifting apart.
 */
import { z } from 'zod';
import { isoDate, nameText, personRef, recordId } from './api-fields.ts';
import { ACCESS_LINK_MAX_DAYS } from './account-rules.ts';
import type { SeriesResults } from './series-results.ts';

export const SERIES_NAME_MAX_LENGTH = 160;
export const SERIES_MIN_MEMBERS = 2;
export const SERIES_MAX_MEMBERS = 50;

// ---------------------------------------------------------------- building blocks

const meanWithError = z.object({ mean: z.number(), stdError: z.number() });
/** A diffusion coefficient in the three units readers use. */
const diffusionValue = z.object({ a2PerPs: z.number(), e9M2PerS: z.number(), cm2PerS: z.number() });
const energyPair = z.object({ kJPerMol: z.number(), eV: z.number() });

export const phaseNameSchema = z.enum(['solid', 'liquid', 'vapour', 'unclear']);
export const branchSchema = z.enum(['heating', 'cooling']);
export const motionRegimeSchema = z.enum(['diffusive', 'subdiffusive', 'superdiffusive', 'bounded', 'too-short']);

// ---------------------------------------------------------------- requests

const trajectoryIdList = (what: string) => z.array(recordId, { error: `must be a list of trajectory ids` })
  .max(SERIES_MAX_MEMBERS, `must list at most ${SERIES_MAX_MEMBERS} trajectories`)
  .refine((ids) => new Set(ids).size === ids.length, `must not list a trajectory twice (${what})`);

/** Body of POST /api/projects/:id/series. Members take the order given. */
export const createSeriesBody = z.object({
  name: nameText(SERIES_NAME_MAX_LENGTH),
  trajectoryIds: trajectoryIdList('trajectoryIds').min(SERIES_MIN_MEMBERS, `must list at least ${SERIES_MIN_MEMBERS} trajectories`),
}).strict();
export type CreateSeries = z.infer<typeof createSeriesBody>;

/** One member's settings in a PATCH. */
export const memberSettingsBody = z.object({
  trajectoryId: recordId,
  /** Left out of the Arrhenius fit, latent heat and dE/dT (still shown, phase still named). */
  excludedFromFit: z.boolean().optional(),
  /** How the state was reached, for hysteresis; null clears it. */
  branch: branchSchema.nullable().optional(),
}).strict();

/**
 * Body of PATCH /api/series/:id; at least one field. `trajectoryIds` is the
 * whole member list in its new order (reorders, adds and removes at once) and
 * cannot be combined with `addTrajectoryIds`/`removeTrajectoryIds`. Added
 * members go to the end. A series keeps at least two members.
 */
export const patchSeriesBody = z.object({
  name: nameText(SERIES_NAME_MAX_LENGTH).optional(),
  trajectoryIds: trajectoryIdList('trajectoryIds').min(SERIES_MIN_MEMBERS, `must list at least ${SERIES_MIN_MEMBERS} trajectories`).optional(),
  addTrajectoryIds: trajectoryIdList('addTrajectoryIds').min(1, 'must list at least one trajectory').optional(),
  removeTrajectoryIds: trajectoryIdList('removeTrajectoryIds').min(1, 'must list at least one trajectory').optional(),
  members: z.array(memberSettingsBody).min(1, 'must list at least one member').max(SERIES_MAX_MEMBERS).optional(),
  /** Start again the analyses of members whose run failed or was cancelled. */
  retryFailed: z.boolean().optional(),
}).strict()
  .refine((b) => Object.values(b).some((v) => v !== undefined), { message: 'give at least one field to change' })
  .refine((b) => !(b.trajectoryIds && (b.addTrajectoryIds || b.removeTrajectoryIds)), {
    message: 'give either the whole list or additions and removals, not both', path: ['trajectoryIds'],
  });
export type PatchSeries = z.infer<typeof patchSeriesBody>;

export const createSeriesAccessLinkBody = z.object({
  expiresInDays: z.number({ error: 'must be a number of days' }).int('must be a whole number of days')
    .min(1, 'must be at least 1 day').max(ACCESS_LINK_MAX_DAYS, `must be at most ${ACCESS_LINK_MAX_DAYS} days`),
}).strict();

// ---------------------------------------------------------------- results (mirror of shared/series-results.ts)

export const phaseEvidenceSchema = z.object({
  kind: z.enum(['diffusion', 'lindemann', 'structure', 'density', 'structure-factor']),
  /** `fluid` = liquid or vapour, `condensed` = solid or liquid, `neutral` in between, `missing` no analysis. */
  verdict: z.enum(['solid', 'liquid', 'vapour', 'fluid', 'condensed', 'neutral', 'missing']),
  value: z.number().nullable(),
  unit: z.string(),
  /** The number, its error and the criterion, in words. */
  detail: z.string(),
});

export const memberPhaseSchema = z.object({
  phase: phaseNameSchema,
  reason: z.string(),
  evidence: z.array(phaseEvidenceSchema),
});

export const rdfShapeSchema = z.object({
  firstPeak: z.object({ rA: z.number(), g: z.number() }),
  firstMinimum: z.object({ rA: z.number(), g: z.number(), coordination: z.number().nullable() }).nullable(),
  minToPeakRatio: z.number().nullable(),
  packing: z.number().nullable(),
  pair: z.string(),
  shells: z.boolean(),
});

export const memberEnergySchema = z.object({
  /** eV per atom. */
  eV: z.number(),
  stdError: z.number().nullable(),
  kind: z.enum(['total', 'kinetic']),
});

export const seriesMemberResultSchema = z.object({
  trajectoryId: recordId,
  name: z.string(),
  position: z.number().int(),
  branch: branchSchema.nullable(),
  excludedFromFits: z.boolean(),
  /** Used in fits and charts: measured when the run has one, else stated. */
  temperatureK: z.number().nullable(),
  temperatureSource: z.enum(['measured', 'stated', 'none']),
  statedTemperatureK: z.number().nullable(),
  measuredTemperatureK: meanWithError.nullable(),
  densityGPerCm3: meanWithError.nullable(),
  pressureBar: z.object({ value: z.number(), stdError: z.number().nullable(), source: z.enum(['stated', 'virial']) }).nullable(),
  d: diffusionValue.nullable(),
  dStdError: diffusionValue.nullable(),
  motionRegime: motionRegimeSchema.nullable(),
  lindemannRatio: z.number().nullable(),
  rdfShape: rdfShapeSchema.nullable(),
  sqPeak: z.object({ qInvA: z.number(), s: z.number() }).nullable(),
  energyPerAtom: memberEnergySchema.nullable(),
  /** Harmonic (VDOS, quantum weights), k_B per atom. */
  cvHarmonicPerAtomKB: z.number().nullable(),
  /** From the run's own energy fluctuations, k_B per atom. */
  cvFluctuationPerAtomKB: z.object({ value: z.number(), stdError: z.number().nullable() }).nullable(),
  phase: memberPhaseSchema,
  notes: z.array(z.string()),
});

export const arrheniusFitSchema = z.object({
  status: z.enum(['fitted', 'not-enough-points']),
  message: z.string().nullable(),
  activationEnergy: energyPair.nullable(),
  activationEnergyStdError: energyPair.nullable(),
  d0: diffusionValue.nullable(),
  d0StdError: diffusionValue.nullable(),
  rangeK: z.object({ min: z.number(), max: z.number() }).nullable(),
  points: z.array(z.object({
    trajectoryId: recordId,
    temperatureK: z.number(),
    /** Å²/ps. */
    d: z.number(),
    dStdError: z.number().nullable(),
    /** ln D − fitted ln D. */
    lnResidual: z.number(),
    normalisedResidual: z.number().nullable(),
  })),
  leftOut: z.array(z.object({ trajectoryId: recordId, reason: z.string() })),
  chiSquared: z.number().nullable(),
  degreesOfFreedom: z.number().int(),
  errorMethod: z.enum(['d-errors', 'scatter', 'none']),
  /** E.g. the fitted points span a phase change. */
  warnings: z.array(z.string()),
});

const bracketEnd = z.object({ trajectoryId: recordId, temperatureK: z.number() });

export const transitionSchema = z.object({
  kind: z.enum(['melting', 'boiling']),
  lowPhase: phaseNameSchema,
  highPhase: phaseNameSchema,
  /** First the whole series (`all`), then each heating or cooling branch present. */
  brackets: z.array(z.object({
    branch: z.enum(['heating', 'cooling', 'all']),
    below: bracketEnd.nullable(),
    above: bracketEnd.nullable(),
    overlap: z.boolean(),
    message: z.string(),
  })),
  /** Where heating and cooling branches both bracket it (hysteresis loop). */
  hysteresisBounds: z.object({ lowerK: z.number(), upperK: z.number(), message: z.string() }).nullable(),
  /** Superheating/supercooling caution (SCIENCE item 31). */
  caution: z.string(),
});

export const caloricCurveSchema = z.object({
  energyKind: z.enum(['total', 'kinetic', 'mixed', 'none']),
  /** Says which energy the curve holds (kinetic only, and why, when there are no potential energies). */
  note: z.string(),
  points: z.array(z.object({
    trajectoryId: recordId,
    temperatureK: z.number(),
    energyPerAtomEV: z.number(),
    stdError: z.number().nullable(),
    phase: phaseNameSchema,
    branch: branchSchema.nullable(),
  })),
  latentHeat: z.object({
    kJPerMol: z.number(),
    eVPerAtom: z.number(),
    stdErrorKJPerMol: z.number().nullable(),
    stdErrorEVPerAtom: z.number().nullable(),
    atK: z.number(),
    method: z.string(),
  }).nullable(),
  latentHeatNote: z.string(),
});

export const heatCapacityPointSchema = z.object({
  temperatureK: z.number(),
  perAtomKB: z.number(),
  stdErrorKB: z.number().nullable(),
  jPerMolK: z.number(),
  /** dE/dT between neighbours, a member's own fluctuations, or its harmonic VDOS value. */
  source: z.enum(['slope', 'fluctuation', 'harmonic-vdos']),
  trajectoryIds: z.array(recordId),
  /** A slope across a phase change holds latent heat, not Cv. */
  acrossTransition: z.boolean(),
  energyKind: z.enum(['total', 'kinetic']).nullable(),
});

export const phaseCriteriaSchema = z.object({
  mobilitySigmas: z.number(),
  lindemannSolidBelow: z.number(),
  lindemannFluidAbove: z.number(),
  rdfOrderedBelow: z.number(),
  rdfGasAbove: z.number(),
  packingCondensedAbove: z.number(),
  packingDiluteBelow: z.number(),
  densityCondensedFraction: z.number(),
  densityDiluteFraction: z.number(),
  structureFactorFreezing: z.number(),
  structureFactorGasBelow: z.number(),
});

export const seriesResultsSchema = z.object({
  members: z.array(seriesMemberResultSchema),
  arrhenius: arrheniusFitSchema,
  melting: transitionSchema,
  boiling: transitionSchema,
  caloric: caloricCurveSchema,
  heatCapacity: z.array(heatCapacityPointSchema),
  criteria: phaseCriteriaSchema,
  warnings: z.array(z.string()),
});
export type SeriesResultsDto = z.infer<typeof seriesResultsSchema>;

// ---------------------------------------------------------------- the series

/**
 * `running`: some member's analyses are queued or running;
 * `ready`: every member has its report and the results are computed from all of them;
 * `incomplete`: nothing is running but some members have no report (inspection or a run failed,
 * was cancelled, or the trajectory is still being inspected); results use the others.
 */
export const SERIES_STATUSES = ['running', 'ready', 'incomplete'] as const;
export type SeriesStatus = (typeof SERIES_STATUSES)[number];

/**
 * One member's analyses: `waiting` (trajectory not inspected yet), `queued`,
 * `running`, `done` (every needed analysis has a report), `failed`
 * (inspection or a run failed), `cancelled`.
 */
export const MEMBER_STATUSES = ['waiting', 'queued', 'running', 'done', 'failed', 'cancelled'] as const;
export type MemberStatus = (typeof MEMBER_STATUSES)[number];

export const seriesMemberRunSchema = z.object({
  id: recordId,
  analyses: z.array(z.string()),
  status: z.enum(['queued', 'running', 'done', 'failed', 'cancelled']),
  /** 0–100. */
  progress: z.number(),
  reportId: recordId.nullable(),
  error: z.string().nullable(),
});

export const seriesMemberSchema = z.object({
  trajectoryId: recordId,
  trajectoryName: z.string(),
  /** 0-based place in the series' order. */
  position: z.number().int(),
  branch: branchSchema.nullable(),
  excludedFromFit: z.boolean(),
  /** The trajectory's stated temperature (metadata), K. */
  statedTemperatureK: z.number().nullable(),
  /** Kinetic temperature measured by the thermo analysis; null until it has run. */
  measuredTemperatureK: meanWithError.nullable(),
  densityGPerCm3: meanWithError.nullable(),
  pressureBar: z.object({ value: z.number(), stdError: z.number().nullable(), source: z.enum(['stated', 'virial']) }).nullable(),
  atoms: z.number().int().nullable(),
  /** The analyses this member needs (energy only where the trajectory has an interaction model or file energies). */
  analyses: z.array(z.string()),
  status: z.enum(MEMBER_STATUSES),
  /** 0–100 over the member's needed analyses. */
  progress: z.number(),
  /** Why the member is waiting, failed or was cancelled, in plain words. */
  message: z.string().nullable(),
  /** The runs started for this member (finished reports reused start none). */
  runs: z.array(seriesMemberRunSchema),
  /** The reports its results are read from, one per analysis key. */
  reportIds: z.array(recordId),
  reportByAnalysis: z.record(z.string(), recordId),
});
export type SeriesMemberDto = z.infer<typeof seriesMemberSchema>;

/** A series in a list: enough for the project page. */
export const seriesListItemSchema = z.object({
  id: recordId,
  projectId: recordId,
  name: z.string(),
  status: z.enum(SERIES_STATUSES),
  memberCount: z.number().int(),
  /** Members' temperatures (measured, else stated), K; null when none is known. */
  temperatureRangeK: z.object({ min: z.number(), max: z.number() }).nullable(),
  /** Fitted E_a, when there is one. */
  activationEnergy: z.object({ kJPerMol: z.number(), kJPerMolStdError: z.number().nullable() }).nullable(),
  /** Melting bracket of the whole series, when there is one. */
  meltingBracketK: z.object({ belowK: z.number(), aboveK: z.number() }).nullable(),
  /** Null behind an access link, which never shows people. */
  createdBy: personRef.nullable(),
  createdAt: isoDate,
  updatedAt: isoDate,
});
export type SeriesListItem = z.infer<typeof seriesListItemSchema>;

/** GET /api/series/:id: the series with its members, status and results. */
export const seriesSchema = seriesListItemSchema.extend({
  members: z.array(seriesMemberSchema),
  /** Null until at least one member has a report. */
  results: seriesResultsSchema.nullable(),
  resultsComputedAt: isoDate.nullable(),
  /** The methods text: members, analyses, fits, criteria — one paragraph per item. */
  methods: z.array(z.string()),
  /** The usual caution: a simulation is a model. */
  caution: z.string(),
});
export type SeriesDto = z.infer<typeof seriesSchema>;

// ---------------------------------------------------------------- overlay curves

export const OVERLAY_KINDS = ['msd', 'vacf', 'vdos', 'rdf', 'sq'] as const;
export type OverlayKind = (typeof OVERLAY_KINDS)[number];

export const overlayLineSchema = z.object({
  trajectoryId: recordId,
  name: z.string(),
  /** The member's temperature (measured, else stated), for the colour scale; null when unknown. */
  temperatureK: z.number().nullable(),
  phase: phaseNameSchema.nullable(),
  reportId: recordId,
  x: z.array(z.number()),
  /** Null where a point is undefined. */
  y: z.array(z.number().nullable()),
});

/** One chart: every member's curve of one kind, same axes. */
export const overlaySchema = z.object({
  kind: z.enum(OVERLAY_KINDS),
  /** e.g. "MSD all", "g all", "normalised VACF all". */
  x: z.object({ label: z.string(), unit: z.string() }),
  y: z.object({ label: z.string(), unit: z.string() }),
  lines: z.array(overlayLineSchema),
});
export type Overlay = z.infer<typeof overlaySchema>;

/** GET /api/series/:id/curves → `{curves: Overlay[]}`, one per kind that at least one member has. */
export const seriesCurvesSchema = z.array(overlaySchema);

// ---------------------------------------------------------------- sharing

export const seriesAccessLinkSchema = z.object({
  id: recordId,
  seriesId: recordId,
  createdBy: z.string(),
  createdAt: isoDate,
  expiresAt: isoDate,
  revokedAt: isoDate.nullable(),
  revokedReason: z.enum(['revoked', 'creator_left', 'creator_demoted']).nullable(),
  lastUsedAt: isoDate.nullable(),
});
export type SeriesAccessLinkView = z.infer<typeof seriesAccessLinkSchema>;

export const newSeriesAccessLinkSchema = z.object({
  id: recordId,
  seriesId: recordId,
  token: z.string(),
  /** `${origin}/links/${token}`: the same signed-out link page as for reports. */
  url: z.string(),
  expiresAt: isoDate,
});
export type NewSeriesAccessLink = z.infer<typeof newSeriesAccessLinkSchema>;

/**
 * GET /api/links/:token for a series link answers `{link: LinkedSeries}`
 * (a report link keeps answering `{link: {expiresAt, report}}`): tell them
 * apart by the `series` key. Overlays behind a link: GET /api/links/:token/series-curves.
 */
export const linkedSeriesSchema = z.object({ expiresAt: isoDate, series: seriesSchema });
export type LinkedSeries = z.infer<typeof linkedSeriesSchema>;

// ---------------------------------------------------------------- engine ↔ API agreement (compile time)

type Assignable<T extends U, U> = T;
/** Fails to compile when the engine's results stop fitting the API schema, or the other way round. */
export type EngineResultsFitApi = [Assignable<SeriesResults, SeriesResultsDto>, Assignable<SeriesResultsDto, SeriesResults>];
