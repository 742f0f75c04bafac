import { boolean, char, index, mysqlEnum, mysqlTable, varchar } from 'drizzle-orm/mysql-core';
import { createdAt, id, ref, timestamp } from './columns.ts';
import { SITE_ROLES } from '../../../shared/accounts.ts';

export const users = mysqlTable('users', {
  id: id(),
  email: varchar('email', { length: 254 }).notNull().unique(),
  displayName: varchar('display_name', { length: 120 }).notNull(),
  /** `scrypt$N$r$p$salt$hash`: the KDF parameters travel with the hash. */
  passwordHash: varchar('password_hash', { length: 255 }).notNull(),
  role: mysqlEnum('role', SITE_ROLES).notNull().default('member'),
  disabled: boolean('disabled').notNull().default(false),
  createdAt: createdAt(),
});

export const apiTokens = mysqlTable('api_tokens', {
  id: id(),
  userId: ref('user_id').references(() => users.id, { onDelete: 'cascade' }),
  name: varchar('name', { length: 120 }).notNull(),
  /** sha256 of the token; the token itself is shown once and never stored. */
  tokenHash: char('token_hash', { length: 64 }).notNull().unique(),
  prefix: varchar('prefix', { length: 16 }).notNull(),
  createdAt: createdAt(),
  lastUsedAt: timestamp('last_used_at'),
  /** Optional: the token stops working at this time. */
  expiresAt: timestamp('expires_at'),
  revokedAt: timestamp('revoked_at'),
  /** Why it stopped: revoked by its owner, or by a password reset or the account being disabled. */
  revokedReason: mysqlEnum('revoked_reason', ['owner', 'password_reset', 'account_disabled']),
}, (t) => [index('api_tokens_user').on(t.userId)]);

export const tokenRevocationReasons = ['owner', 'password_reset', 'account_disabled'] as const;
export type TokenRevocationReason = (typeof tokenRevocationReasons)[number];

export const passwordResets = mysqlTable('password_resets', {
  id: id(),
  userId: ref('user_id').references(() => users.id, { onDelete: 'cascade' }),
  tokenHash: char('token_hash', { length: 64 }).notNull().unique(),
  expiresAt: timestamp('expires_at').notNull(),
  usedAt: timestamp('used_at'),
  createdAt: createdAt(),
});

export type UserRow = typeof users.$inferSelect;
export const userRoles = ['admin', 'member'] as const;
