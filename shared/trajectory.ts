/**
 * Trajectory metadata as the browser edits it and the server stores it: one
 * schema so both sides accept the same values.
 */
import { z } from 'zod';
import { fileQuantitiesSchema } from './file-quantities.ts';
import { isoDate, personRef, recordId } from './api-fields.ts';
import { ELEMENTS, guessElement } from './elements.ts';

export const LENGTH_UNITS = ['angstrom', 'nm', 'pm', 'bohr'] as const;
export const TIME_UNITS = ['fs', 'ps', 'ns', 'au'] as const;
export const VELOCITY_UNITS = ['angstrom/ps', 'angstrom/fs', 'nm/ps', 'm/s', 'bohr/au', 'angstrom/au'] as const;
export const ENSEMBLES = ['NVE', 'NVT', 'NPT', 'other'] as const;
export const BOUNDARIES = ['periodic', 'walls', 'none'] as const;
export const TRAJECTORY_STATUSES = ['uploading', 'inspecting', 'ready', 'failed'] as const;

/** Labels people read; the stored values stay ASCII. */
export const UNIT_LABELS: Record<string, string> = {
  angstrom: 'Å', nm: 'nm', pm: 'pm', bohr: 'bohr', fs: 'fs', ps: 'ps', ns: 'ns', au: 'atomic units',
  'angstrom/ps': 'Å/ps', 'angstrom/fs': 'Å/fs', 'nm/ps': 'nm/ps', 'm/s': 'm/s', 'bohr/au': 'bohr/a.u.', 'angstrom/au': 'Å/a.u.',
};

/**
 * What a species label stands for. `exact`: the label is an element symbol,
 * case and all ("Ca"); `assumed`: guessed from a case-exact symbol at its
 * start ("CA" → C, "OW" → O, "Ar1" → Ar) and to be confirmed; `unknown`: no
 * guess ("bead", "ca"), a mass must be given; `confirmed`: set by a user.
 */
export const SPECIES_ELEMENT_STATUSES = ['exact', 'assumed', 'unknown', 'confirmed'] as const;
export const speciesElementSchema = z.object({
  /** Element symbol, or null for a bead or pseudo-atom with its own mass. */
  element: z.string().nullable(),
  /** Mass in u used by every analysis; null only while unknown. */
  massU: z.number().nullable(),
  status: z.enum(SPECIES_ELEMENT_STATUSES),
});
export type SpeciesElement = z.infer<typeof speciesElementSchema>;

/**
 * A user's answer for one species: its element (a symbol, case and all, or
 * null for a bead or pseudo-atom) and the mass every analysis uses, u. The
 * mass defaults to the element's standard atomic weight.
 */
export const speciesElementChoiceSchema = z.object({
  element: z.string().nullable().refine((e) => e === null || ELEMENTS.has(e), { message: 'must be an element symbol, case and all (e.g. "C", "Ca"), or empty for a bead' }),
  massU: z.number({ error: 'must be a number' }).positive('must be above 0 u').max(1e6, 'must be at most 1 000 000 u').optional(),
}).strict().refine((c) => c.element !== null || c.massU !== undefined, { message: 'give a mass for a species without an element', path: ['massU'] });
export type SpeciesElementChoice = z.infer<typeof speciesElementChoiceSchema>;

/** What the user confirmed: the element and mass, stored with status `confirmed`. */
export function confirmedElement(choice: SpeciesElementChoice): SpeciesElement {
  return { element: choice.element, massU: choice.massU ?? ELEMENTS.get(choice.element!)!.massU, status: 'confirmed' };
}

/** Every species' element: the stored answers, and the case-exact guess for a species nobody confirmed. */
export function speciesElementsOf(labels: readonly string[], stored: Readonly<Record<string, SpeciesElement>> | null | undefined): Record<string, SpeciesElement> {
  return Object.fromEntries(labels.map((label) => [label, stored?.[label] ?? guessElement(label)]));
}

/**
 * Masses a run must be told, by species label: those whose stored element or
 * mass differs from what the label alone gives by the case-exact rule (a
 * confirmed change, or an unknown label given a mass). A mass the run's own
 * settings already give, by label or by element symbol, is left to them.
 */
export function massesToFill(elements: Readonly<Record<string, SpeciesElement>>, given: Readonly<Record<string, number>> = {}): Record<string, number> {
  const out: Record<string, number> = {};
  for (const [label, e] of Object.entries(elements)) {
    if (e.massU === null || given[label] !== undefined || (e.element && given[e.element] !== undefined)) continue;
    const guess = guessElement(label);
    if (guess.massU !== e.massU) out[label] = e.massU;
  }
  return out;
}

const text = (max: number) => z.string().trim().max(max, `at most ${max} characters`);

/** Fields the uploader may set or correct; every one optional in a PATCH. */
export const trajectoryMetadataSchema = z.object({
  name: text(255).min(1, 'must not be empty'),
  temperatureK: z.number().positive('must be above 0 K').max(1e6, 'must be at most 1 000 000 K').nullable(),
  ensemble: z.enum(ENSEMBLES).nullable(),
  timeStep: z.number().positive('must be above 0').max(1e9).nullable(),
  timeUnit: z.enum(TIME_UNITS),
  lengthUnit: z.enum(LENGTH_UNITS),
  velocityUnit: z.enum(VELOCITY_UNITS),
  boundary: z.enum(BOUNDARIES),
  /** Holonomic constraints of the whole system: 3 per rigid water, 2 per diatomic that does not rotate… */
  constraints: z.number().int('must be a whole number').min(0, 'must be 0 or more').max(1e9).nullable(),
  potential: text(255),
  engine: text(255),
  notes: text(10_000),
  /** Which per-frame file numbers are energies, pressure or temperature, and their units. */
  fileQuantities: fileQuantitiesSchema.nullable(),
  /** Species → element and mass as the user confirms them; only species of this trajectory. */
  speciesElements: z.record(z.string().min(1).max(32), speciesElementChoiceSchema)
    .refine((m) => Object.keys(m).length <= 64, 'at most 64 species at once'),
}).partial().strict();

export type TrajectoryMetadata = z.infer<typeof trajectoryMetadataSchema>;

/** Body of PATCH /api/projects/:id/trajectories: one metadata change for several trajectories (names stay their own). */
export const bulkMetadataBody = z.object({
  ids: z.array(z.number().int().positive(), { error: 'must be a list of trajectory ids' }).min(1, 'name at least one trajectory').max(500, 'at most 500 at once'),
  changes: trajectoryMetadataSchema.omit({ name: true, speciesElements: true }).refine((c) => Object.keys(c).length > 0, 'give at least one field to change'),
}).strict();
export type BulkMetadata = z.infer<typeof bulkMetadataBody>;

/** A frame range as the frames and cut routes take it: 0-based, `to` exclusive. */
export const frameRangeQuery = z.object({
  from: z.coerce.number().int().min(0).default(0),
  to: z.coerce.number().int().min(1).default(Number.MAX_SAFE_INTEGER),
  stride: z.coerce.number().int().min(1).max(1_000_000).default(1),
}).refine((r) => r.to > r.from, { message: 'to must be greater than from', path: ['to'] });

/** A trajectory as the API returns it. */
export const trajectorySchema = z.object({
  id: recordId,
  projectId: recordId,
  name: z.string(),
  sizeBytes: z.number().int(),
  /** Bytes of the binary frame store written at inspection (counted in the project's storage). */
  frameStoreBytes: z.number().int(),
  /**
   * Where inspection judged the run equilibrated (automated equilibration
   * detection on the series named), offered as the analyses' discard; null
   * when nothing could be judged.
   */
  equilibration: z.object({ frame: z.number().int(), judgedFrom: z.string() }).nullable(),
  sha256: z.string().nullable(),
  format: z.string().nullable(),
  compression: z.string().nullable(),
  status: z.enum(TRAJECTORY_STATUSES),
  /** The reader's message when inspection failed: file, frame, line. */
  error: z.string().nullable(),
  atoms: z.number().int().nullable(),
  frames: z.number().int().nullable(),
  speciesCounts: z.record(z.string(), z.number().int()).nullable(),
  /** Each species' element and mass as every analysis uses them; `assumed` and `unknown` ones await confirmation. */
  speciesElements: z.record(z.string(), speciesElementSchema),
  cell: z.array(z.number()).nullable(),
  cellChanges: z.boolean().nullable(),
  hasVelocities: z.boolean().nullable(),
  timeStep: z.number().nullable(),
  timeUnit: z.string(),
  lengthUnit: z.string(),
  velocityUnit: z.string(),
  temperatureK: z.number().nullable(),
  ensemble: z.string().nullable(),
  boundary: z.string(),
  constraints: z.number().int().nullable(),
  potential: z.string(),
  engine: z.string(),
  notes: z.string(),
  /** Metadata fields whose value was read from the file. */
  fromFile: z.array(z.string()),
  /** Per-frame numbers the file carries (lower-case names), e.g. energy, pressure. */
  fileValues: z.array(z.string()),
  fileQuantities: fileQuantitiesSchema.nullable(),
  /** Whose interaction model the energy analysis would use. */
  interactionModelSource: z.enum(['trajectory', 'project']).nullable(),
  uploadedBy: personRef,
  createdAt: isoDate,
});
export type TrajectoryDto = z.infer<typeof trajectorySchema>;
