import { sql } from 'drizzle-orm';
import { boolean, char, datetime, index, int, json, mysqlEnum, mysqlTable, primaryKey, varchar } from 'drizzle-orm/mysql-core';
import { createdAt, id, ref, timestamp } from './columns.ts';
import { reports } from './analyses.ts';
import { projects } from './projects.ts';
import { trajectories } from './trajectories.ts';
import { users } from './users.ts';

/**
 * Read-only links to one report or one series (exactly one of the two ids is
 * set); anyone holding the token may read it until it expires or is revoked.
 */
export const accessLinks = mysqlTable('access_links', {
  id: id(),
  projectId: ref('project_id').references(() => projects.id, { onDelete: 'cascade' }),
  reportId: int('report_id').references(() => reports.id, { onDelete: 'cascade' }),
  seriesId: int('series_id').references(() => series.id, { onDelete: 'cascade' }),
  tokenHash: char('token_hash', { length: 64 }).notNull().unique(),
  createdBy: ref('created_by').references(() => users.id),
  expiresAt: timestamp('expires_at').notNull(),
  revokedAt: timestamp('revoked_at'),
  /** Why it stopped: revoked by a member, or its creator left the project or lost the right to share. */
  revokedReason: mysqlEnum('revoked_reason', ['revoked', 'creator_left', 'creator_demoted']),
  lastUsedAt: timestamp('last_used_at'),
  createdAt: createdAt(),
}, (t) => [index('access_links_report').on(t.reportId), index('access_links_series').on(t.seriesId), index('access_links_creator').on(t.projectId, t.createdBy)]);

/** A comparison: trajectories of one system, e.g. a temperature series. */
export const series = mysqlTable('series', {
  id: id(),
  projectId: ref('project_id').references(() => projects.id, { onDelete: 'cascade' }),
  name: varchar('name', { length: 160 }).notNull(),
  createdBy: ref('created_by').references(() => users.id),
  createdAt: createdAt(),
  /** Last change of name or members. */
  updatedAt: datetime('updated_at', { mode: 'date', fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`),
  /** Results as last computed (shared/series-results.ts), so reading a series is cheap. */
  results: json('results').$type<Record<string, unknown>>(),
  /** What the stored results were computed from (members, their settings and report ids); a change means recompute. */
  resultsBasis: char('results_basis', { length: 64 }),
  resultsComputedAt: timestamp('results_computed_at'),
});

export const seriesMembers = mysqlTable('series_members', {
  seriesId: ref('series_id').references(() => series.id, { onDelete: 'cascade' }),
  trajectoryId: ref('trajectory_id').references(() => trajectories.id, { onDelete: 'cascade' }),
  /** 0-based place in the series' order. */
  position: int('position').notNull().default(0),
  excludedFromFit: boolean('excluded_from_fit').notNull().default(false),
  /** How the state was reached: heating a colder state or cooling a hotter one. */
  branch: mysqlEnum('branch', ['heating', 'cooling']),
  /** Analysis runs the series started for this member, oldest first. */
  runIds: json('run_ids').$type<number[]>(),
  /** Why the member's analyses could not be started, in plain words. */
  problem: varchar('problem', { length: 2000 }),
}, (t) => [primaryKey({ columns: [t.seriesId, t.trajectoryId] }), index('series_members_trajectory').on(t.trajectoryId)]);

/** Who changed membership, roles, tokens and links, and when. */
export const auditLog = mysqlTable('audit_log', {
  id: id(),
  projectId: int('project_id'),
  actorId: int('actor_id'),
  action: varchar('action', { length: 64 }).notNull(),
  details: json('details').$type<Record<string, unknown>>().notNull(),
  createdAt: createdAt(),
}, (t) => [index('audit_log_project').on(t.projectId, t.createdAt)]);
