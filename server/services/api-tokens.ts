import { and, desc, eq, isNull, lt, or } from 'drizzle-orm';
import type { CurrentUser } from '../auth/authorize.ts';
import { toCurrentUser } from '../auth/current-user.ts';
import { newSecretToken, sha256Hex } from '../auth/secret-token.ts';
import type { Database } from '../db/client.ts';
import { apiTokens, users } from '../db/schema/index.ts';
import { notFound } from '../errors.ts';
import { recordAudit } from './audit.ts';
import type { ApiToken, NewApiToken } from '../../shared/accounts.ts';

const TOKEN_PREFIX = 'erg_';
/** last_used_at is refreshed at most this often, so busy scripts do not write on every call. */
const LAST_USED_RESOLUTION_MS = 60_000;

export async function createApiToken(db: Database, userId: number, name: string): Promise<NewApiToken> {
  const { token, hash } = newSecretToken(TOKEN_PREFIX);
  const prefix = token.slice(0, TOKEN_PREFIX.length + 6);
  const [{ id }] = await db.insert(apiTokens).values({ userId, name, tokenHash: hash, prefix }).$returningId();
  await recordAudit(db, { projectId: null, actorId: userId, action: 'token.created', details: { tokenId: id, name } });
  const [row] = await db.select().from(apiTokens).where(eq(apiTokens.id, id));
  return { id, name, prefix, createdAt: row!.createdAt.toISOString(), lastUsedAt: null, token };
}

/** The caller's tokens that still work. */
export async function listApiTokens(db: Database, userId: number): Promise<ApiToken[]> {
  const rows = await db.select({
    id: apiTokens.id, name: apiTokens.name, prefix: apiTokens.prefix, createdAt: apiTokens.createdAt, lastUsedAt: apiTokens.lastUsedAt,
  }).from(apiTokens).where(and(eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt))).orderBy(desc(apiTokens.createdAt));
  return rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString(), lastUsedAt: r.lastUsedAt?.toISOString() ?? null }));
}

export async function revokeApiToken(db: Database, userId: number, tokenId: number): Promise<void> {
  const [result] = await db.update(apiTokens).set({ revokedAt: new Date() })
    .where(and(eq(apiTokens.id, tokenId), eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)));
  if (result.affectedRows !== 1) throw notFound('API token');
  await recordAudit(db, { projectId: null, actorId: userId, action: 'token.revoked', details: { tokenId } });
}

/** The active owner of a presented token, or null; notes when it was last used. */
export async function resolveApiToken(db: Database, token: string, now = new Date()): Promise<CurrentUser | null> {
  if (!token.startsWith(TOKEN_PREFIX)) return null;
  const [row] = await db.select({ tokenId: apiTokens.id, revokedAt: apiTokens.revokedAt, user: users })
    .from(apiTokens).innerJoin(users, eq(users.id, apiTokens.userId)).where(eq(apiTokens.tokenHash, sha256Hex(token)));
  if (!row || row.revokedAt || row.user.disabled) return null;
  await db.update(apiTokens).set({ lastUsedAt: now }).where(and(eq(apiTokens.id, row.tokenId),
    or(isNull(apiTokens.lastUsedAt), lt(apiTokens.lastUsedAt, new Date(now.getTime() - LAST_USED_RESOLUTION_MS)))));
  return toCurrentUser(row.user);
}
