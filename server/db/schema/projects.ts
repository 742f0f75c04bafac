import { char, index, json, mysqlEnum, mysqlTable, primaryKey, text, varchar } from 'drizzle-orm/mysql-core';
import type { InteractionModel } from '../../../shared/interaction-model.ts';
import { createdAt, id, ref, timestamp } from './columns.ts';
import { users } from './users.ts';
import { PROJECT_ROLES } from '../../../shared/projects.ts';

export const projectRoles = PROJECT_ROLES;
export type { ProjectRole } from '../../../shared/projects.ts';

export const projects = mysqlTable('projects', {
  id: id(),
  name: varchar('name', { length: 160 }).notNull(),
  description: text('description').notNull().default(''),
  createdBy: ref('created_by').references(() => users.id),
  createdAt: createdAt(),
  lastActivityAt: timestamp('last_activity_at').notNull(),
  /** Pair potentials shared by the project's trajectories that have none of their own. */
  interactionModel: json('interaction_model').$type<InteractionModel | null>(),
});

export const projectMembers = mysqlTable('project_members', {
  projectId: ref('project_id').references(() => projects.id, { onDelete: 'cascade' }),
  userId: ref('user_id').references(() => users.id, { onDelete: 'cascade' }),
  role: mysqlEnum('role', projectRoles).notNull(),
  createdAt: createdAt(),
}, (t) => [primaryKey({ columns: [t.projectId, t.userId] }), index('project_members_user').on(t.userId)]);

export const invitations = mysqlTable('invitations', {
  id: id(),
  projectId: ref('project_id').references(() => projects.id, { onDelete: 'cascade' }),
  email: varchar('email', { length: 254 }).notNull(),
  role: mysqlEnum('role', projectRoles).notNull(),
  tokenHash: char('token_hash', { length: 64 }).notNull().unique(),
  invitedBy: ref('invited_by').references(() => users.id),
  expiresAt: timestamp('expires_at').notNull(),
  acceptedAt: timestamp('accepted_at'),
  revokedAt: timestamp('revoked_at'),
  createdAt: createdAt(),
});
