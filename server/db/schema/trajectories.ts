import { bigint, boolean, char, double, index, int, json, mysqlEnum, mysqlTable, text, varchar } from 'drizzle-orm/mysql-core';
import type { FileQuantities } from '../../../shared/file-quantities.ts';
import type { InteractionModel } from '../../../shared/interaction-model.ts';
import { createdAt, id, ref, timestamp } from './columns.ts';
import { projects } from './projects.ts';
import { users } from './users.ts';
import { BOUNDARIES, ENSEMBLES, TRAJECTORY_STATUSES, type SpeciesElement } from '../../../shared/trajectory.ts';

export const trajectoryStatuses = TRAJECTORY_STATUSES;
export const ensembles = ENSEMBLES;
export const boundaries = BOUNDARIES;

export const trajectories = mysqlTable('trajectories', {
  id: id(),
  projectId: ref('project_id').references(() => projects.id, { onDelete: 'cascade' }),
  name: varchar('name', { length: 255 }).notNull(),
  objectKey: varchar('object_key', { length: 255 }).notNull(),
  sizeBytes: bigint('size_bytes', { mode: 'number' }).notNull().default(0),
  sha256: char('sha256', { length: 64 }),
  format: varchar('format', { length: 16 }),
  compression: varchar('compression', { length: 8 }),
  status: mysqlEnum('status', trajectoryStatuses).notNull().default('uploading'),
  error: text('error'),
  atoms: int('atoms'),
  frames: int('frames'),
  speciesCounts: json('species_counts').$type<Record<string, number>>(),
  cell: json('cell').$type<number[] | null>(),
  cellChanges: boolean('cell_changes'),
  hasVelocities: boolean('has_velocities'),
  /** Time between frames in `timeUnit`. */
  timeStep: double('time_step'),
  timeUnit: varchar('time_unit', { length: 8 }).notNull().default('ps'),
  lengthUnit: varchar('length_unit', { length: 16 }).notNull().default('angstrom'),
  velocityUnit: varchar('velocity_unit', { length: 16 }).notNull().default('angstrom/ps'),
  temperatureK: double('temperature_k'),
  ensemble: mysqlEnum('ensemble', ensembles),
  boundary: mysqlEnum('boundary', boundaries).notNull().default('periodic'),
  /** Axes along which a periodic trajectory is periodic ("xyz", "xy" for a slab…); null means all three. */
  periodicAxes: varchar('periodic_axes', { length: 3 }),
  /** Holonomic constraints of the whole system (rigid bonds, frozen rotations); null means none stated. */
  constraints: int('constraints'),
  /** Element and mass per species label: read from the file, assumed by inspection, or confirmed by a user. */
  speciesElements: json('species_elements').$type<Record<string, SpeciesElement>>(),
  potential: varchar('potential', { length: 255 }).notNull().default(''),
  engine: varchar('engine', { length: 255 }).notNull().default(''),
  notes: text('notes').notNull().default(''),
  /** Pair potentials of this run; when null, the project's model applies. */
  interactionModel: json('interaction_model').$type<InteractionModel | null>(),
  /** Which per-frame file numbers are potential/total energy, pressure, temperature (with units). */
  fileQuantities: json('file_quantities').$type<FileQuantities | null>(),
  /** Names of the per-frame numbers inspection found in the file. */
  fileValues: json('file_values').$type<string[]>(),
  /** Which metadata fields were read from the file rather than typed in. */
  fromFile: json('from_file').$type<string[]>(),
  /** Object key of the frame-offset index of text uploads inspected before the binary frame store existed. */
  frameIndexKey: varchar('frame_index_key', { length: 255 }),
  /** Object key of the binary frame store's index, written by inspection; analyses and the viewer read only that. */
  frameStoreKey: varchar('frame_store_key', { length: 255 }),
  /** First frame judged equilibrated at inspection (automated equilibration detection), offered as the default discard. */
  equilibrationFrame: int('equilibration_frame'),
  /** The per-frame series that judgement came from, in words. */
  equilibrationSeries: varchar('equilibration_series', { length: 80 }),
  /** Bytes the binary frame store takes in the object store (counted in the project's storage). */
  frameStoreBytes: bigint('frame_store_bytes', { mode: 'number' }).notNull().default(0),
  uploadedBy: ref('uploaded_by').references(() => users.id),
  createdAt: createdAt(),
  updatedAt: timestamp('updated_at'),
}, (t) => [index('trajectories_project').on(t.projectId)]);

export type TrajectoryRow = typeof trajectories.$inferSelect;
