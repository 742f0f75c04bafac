import { and, desc, eq, gt, isNull, lt, or } from 'drizzle-orm';
import type { CurrentUser } from '../auth/authorize.ts';
import { toCurrentUser } from '../auth/current-user.ts';
import { newSecretToken, sha256Hex } from '../auth/secret-token.ts';
import type { Database, Executor } from '../db/client.ts';
import { apiTokens, users, type TokenRevocationReason } from '../db/schema/index.ts';
import { notFound } from '../errors.ts';
import { recordAudit } from './audit.ts';
import type { ApiToken, NewApiToken } from '../../shared/accounts.ts';

const TOKEN_PREFIX = 'erg_';
/** last_used_at is refreshed at most this often, so busy scripts do not write on every call. */
const LAST_USED_RESOLUTION_MS = 60_000;
/** Stopped tokens stay listed this long, so their owner sees what a reset or a disable did. */
const STOPPED_SHOWN_DAYS = 30;

const view = {
  id: apiTokens.id, name: apiTokens.name, prefix: apiTokens.prefix, createdAt: apiTokens.createdAt, lastUsedAt: apiTokens.lastUsedAt,
  expiresAt: apiTokens.expiresAt, revokedAt: apiTokens.revokedAt, revokedReason: apiTokens.revokedReason,
};

function toApiToken(row: { id: number; name: string; prefix: string; createdAt: Date; lastUsedAt: Date | null; expiresAt: Date | null; revokedAt: Date | null; revokedReason: TokenRevocationReason | null }): ApiToken {
  const iso = (d: Date | null) => d?.toISOString() ?? null;
  return { ...row, createdAt: row.createdAt.toISOString(), lastUsedAt: iso(row.lastUsedAt), expiresAt: iso(row.expiresAt), revokedAt: iso(row.revokedAt) };
}

export async function createApiToken(db: Database, userId: number, name: string, expiresAt: Date | null = null): Promise<NewApiToken> {
  const { token, hash } = newSecretToken(TOKEN_PREFIX);
  const prefix = token.slice(0, TOKEN_PREFIX.length + 6);
  const id = await db.transaction(async (tx) => {
    const [{ id: tokenId }] = await tx.insert(apiTokens).values({ userId, name, tokenHash: hash, prefix, expiresAt }).$returningId();
    await recordAudit(tx, { projectId: null, actorId: userId, action: 'token.created', details: { tokenId, name, expiresAt: expiresAt?.toISOString() ?? null } });
    return tokenId;
  });
  const [row] = await db.select(view).from(apiTokens).where(eq(apiTokens.id, id));
  return { ...toApiToken(row!), token };
}

/** The caller's tokens: those that work, and those stopped in the last 30 days with the reason. */
export async function listApiTokens(db: Database, userId: number, now = new Date()): Promise<ApiToken[]> {
  const shownSince = new Date(now.getTime() - STOPPED_SHOWN_DAYS * 86_400_000);
  const rows = await db.select(view).from(apiTokens)
    .where(and(eq(apiTokens.userId, userId), or(isNull(apiTokens.revokedAt), gt(apiTokens.revokedAt, shownSince))))
    .orderBy(desc(apiTokens.createdAt), desc(apiTokens.id));
  return rows.map(toApiToken);
}

export async function revokeApiToken(db: Database, userId: number, tokenId: number): Promise<void> {
  await db.transaction(async (tx) => {
    const [result] = await tx.update(apiTokens).set({ revokedAt: new Date(), revokedReason: 'owner' })
      .where(and(eq(apiTokens.id, tokenId), eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)));
    if (result.affectedRows !== 1) throw notFound('API token');
    await recordAudit(tx, { projectId: null, actorId: userId, action: 'token.revoked', details: { tokenId } });
  });
}

/**
 * Stops every working token of an account: a password reset means the
 * account may have been in someone else's hands, and a disabled account's
 * scripts must not come back to life when it is enabled again.
 */
export async function revokeAllApiTokens(tx: Executor, userId: number, reason: Exclude<TokenRevocationReason, 'owner'>, now = new Date()): Promise<number> {
  const [result] = await tx.update(apiTokens).set({ revokedAt: now, revokedReason: reason })
    .where(and(eq(apiTokens.userId, userId), isNull(apiTokens.revokedAt)));
  return result.affectedRows;
}

/** The active owner of a presented token, or null; notes when it was last used. */
export async function resolveApiToken(db: Database, token: string, now = new Date()): Promise<CurrentUser | null> {
  if (!token.startsWith(TOKEN_PREFIX)) return null;
  const [row] = await db.select({ tokenId: apiTokens.id, revokedAt: apiTokens.revokedAt, expiresAt: apiTokens.expiresAt, user: users })
    .from(apiTokens).innerJoin(users, eq(users.id, apiTokens.userId)).where(eq(apiTokens.tokenHash, sha256Hex(token)));
  if (!row || row.revokedAt || row.user.disabled) return null;
  if (row.expiresAt && row.expiresAt <= now) return null;
  await db.update(apiTokens).set({ lastUsedAt: now }).where(and(eq(apiTokens.id, row.tokenId),
    or(isNull(apiTokens.lastUsedAt), lt(apiTokens.lastUsedAt, new Date(now.getTime() - LAST_USED_RESOLUTION_MS)))));
  return toCurrentUser(row.user);
}
