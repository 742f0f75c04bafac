/**
 * Trajectory metadata as the browser edits it and the server stores it: one
 * schema so both sides accept the same values.
 */
import { z } from 'zod';

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
  potential: text(255),
  engine: text(255),
  notes: text(10_000),
}).partial().strict();

export type TrajectoryMetadata = z.infer<typeof trajectoryMetadataSchema>;

/** A trajectory as the API returns it. */
export interface TrajectoryDto {
  id: number;
  projectId: number;
  name: string;
  sizeBytes: number;
  sha256: string | null;
  format: string | null;
  compression: string | null;
  status: (typeof TRAJECTORY_STATUSES)[number];
  error: string | null;
  atoms: number | null;
  frames: number | null;
  speciesCounts: Record<string, number> | null;
  cell: number[] | null;
  cellChanges: boolean | null;
  hasVelocities: boolean | null;
  timeStep: number | null;
  timeUnit: string;
  lengthUnit: string;
  velocityUnit: string;
  temperatureK: number | null;
  ensemble: string | null;
  boundary: string;
  potential: string;
  engine: string;
  notes: string;
  /** Metadata fields whose value was read from the file. */
  fromFile: string[];
  uploadedBy: { id: number; displayName: string };
  createdAt: string;
}
