import { char, index, int, json, mysqlEnum, mysqlTable, primaryKey, varchar } from 'drizzle-orm/mysql-core';
import { createdAt, id, ref, timestamp } from './columns.ts';
import { reports } from './analyses.ts';
import { projects } from './projects.ts';
import { trajectories } from './trajectories.ts';
import { users } from './users.ts';

/** Read-only links to one report; anyone holding the token may read it until it expires or is revoked. */
export const accessLinks = mysqlTable('access_links', {
  id: id(),
  projectId: ref('project_id').references(() => projects.id, { onDelete: 'cascade' }),
  reportId: ref('report_id').references(() => reports.id, { onDelete: 'cascade' }),
  tokenHash: char('token_hash', { length: 64 }).notNull().unique(),
  createdBy: ref('created_by').references(() => users.id),
  expiresAt: timestamp('expires_at').notNull(),
  revokedAt: timestamp('revoked_at'),
  /** Why it stopped: revoked by a member, or its creator left the project or lost the right to share. */
  revokedReason: mysqlEnum('revoked_reason', ['revoked', 'creator_left', 'creator_demoted']),
  lastUsedAt: timestamp('last_used_at'),
  createdAt: createdAt(),
}, (t) => [index('access_links_report').on(t.reportId), index('access_links_creator').on(t.projectId, t.createdBy)]);

/** A comparison: trajectories of one system, e.g. a temperature series. */
export const series = mysqlTable('series', {
  id: id(),
  projectId: ref('project_id').references(() => projects.id, { onDelete: 'cascade' }),
  name: varchar('name', { length: 160 }).notNull(),
  createdBy: ref('created_by').references(() => users.id),
  createdAt: createdAt(),
});

export const seriesMembers = mysqlTable('series_members', {
  seriesId: ref('series_id').references(() => series.id, { onDelete: 'cascade' }),
  trajectoryId: ref('trajectory_id').references(() => trajectories.id, { onDelete: 'cascade' }),
}, (t) => [primaryKey({ columns: [t.seriesId, t.trajectoryId] })]);

/** Who changed membership, roles, tokens and links, and when. */
export const auditLog = mysqlTable('audit_log', {
  id: id(),
  projectId: int('project_id'),
  actorId: int('actor_id'),
  action: varchar('action', { length: 64 }).notNull(),
  details: json('details').$type<Record<string, unknown>>().notNull(),
  createdAt: createdAt(),
}, (t) => [index('audit_log_project').on(t.projectId, t.createdAt)]);
