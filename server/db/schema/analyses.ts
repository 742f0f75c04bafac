import { char, index, int, json, mysqlEnum, mysqlTable, text, varchar } from 'drizzle-orm/mysql-core';
import { createdAt, id, ref, timestamp } from './columns.ts';
import { projects } from './projects.ts';
import { series } from './sharing.ts';
import { trajectories } from './trajectories.ts';
import { users } from './users.ts';
import { RUN_STATUSES, type RunStatusName } from '../../../shared/analysis-run.ts';

export const runStatuses = RUN_STATUSES;
export type RunStatus = RunStatusName;

/** The durable record of one analysis job; Redis only carries the work. */
export const analysisRuns = mysqlTable('analysis_runs', {
  id: id(),
  projectId: ref('project_id').references(() => projects.id, { onDelete: 'cascade' }),
  trajectoryId: ref('trajectory_id').references(() => trajectories.id, { onDelete: 'cascade' }),
  requestedBy: ref('requested_by').references(() => users.id),
  analyses: json('analyses').$type<string[]>().notNull(),
  params: json('params').$type<Record<string, unknown>>().notNull(),
  /** What the person who started the run wanted to learn or change, in their words; shown with its report. */
  notes: varchar('notes', { length: 2000 }).notNull().default(''),
  status: mysqlEnum('status', runStatuses).notNull().default('queued'),
  progress: int('progress').notNull().default(0),
  queueJobId: varchar('queue_job_id', { length: 64 }),
  /** Which attempt of which worker holds the run while it is running; every write of that worker checks it. */
  claimToken: varchar('claim_token', { length: 128 }),
  attempts: int('attempts').notNull().default(0),
  error: text('error'),
  reportId: int('report_id'),
  createdAt: createdAt(),
  startedAt: timestamp('started_at'),
  finishedAt: timestamp('finished_at'),
}, (t) => [index('analysis_runs_trajectory').on(t.trajectoryId)]);

export const reports = mysqlTable('reports', {
  id: id(),
  runId: ref('run_id'),
  projectId: ref('project_id').references(() => projects.id, { onDelete: 'cascade' }),
  trajectoryId: ref('trajectory_id').references(() => trajectories.id, { onDelete: 'cascade' }),
  title: varchar('title', { length: 255 }).notNull(),
  analyses: json('analyses').$type<string[]>().notNull(),
  params: json('params').$type<Record<string, unknown>>().notNull(),
  summary: json('summary').$type<Record<string, unknown>>().notNull(),
  methods: json('methods').$type<Record<string, unknown>>().notNull(),
  curvesKey: varchar('curves_key', { length: 255 }).notNull(),
  engineVersion: varchar('engine_version', { length: 32 }).notNull(),
  inputSha256: char('input_sha256', { length: 64 }),
  createdAt: createdAt(),
}, (t) => [index('reports_trajectory').on(t.trajectoryId)]);

export const comments = mysqlTable('comments', {
  id: id(),
  /** A comment is on one report or on one series (exactly one of the two). */
  reportId: int('report_id').references(() => reports.id, { onDelete: 'cascade' }),
  seriesId: int('series_id').references(() => series.id, { onDelete: 'cascade' }),
  userId: ref('user_id').references(() => users.id, { onDelete: 'cascade' }),
  body: text('body').notNull(),
  createdAt: createdAt(),
}, (t) => [index('comments_report').on(t.reportId), index('comments_series').on(t.seriesId)]);

