import { and, asc, eq, ne } from 'drizzle-orm';
import type { Database } from '../db/client.ts';
import { users } from '../db/schema/index.ts';
import { conflict, notFound } from '../errors.ts';
import { revokeAllApiTokens } from './api-tokens.ts';
import { recordAudit } from './audit.ts';
import { endSessionsOf } from './sessions.ts';
import type { AdminUser, AdminUserChanges } from '../../shared/admin.ts';

export async function listUsers(db: Database): Promise<AdminUser[]> {
  const rows = await db.select({
    id: users.id, email: users.email, displayName: users.displayName, role: users.role, disabled: users.disabled, createdAt: users.createdAt,
  }).from(users).orderBy(asc(users.id));
  return rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString() }));
}

/**
 * Makes or unmakes an admin, disables or enables an account. The instance
 * always keeps one active admin. Disabling signs the account out everywhere
 * and revokes its API tokens for good (enabling it again does not revive
 * them). Each change and its audit entries form one transaction.
 */
export async function updateUser(db: Database, actorId: number, userId: number, changes: AdminUserChanges): Promise<AdminUser> {
  await db.transaction(async (tx) => {
    const [target] = await tx.select().from(users).where(eq(users.id, userId)).for('update');
    if (!target) throw notFound('User');
    const losesAdmin = target.role === 'admin' && !target.disabled && (changes.role === 'member' || changes.disabled === true);
    if (losesAdmin) {
      // Locking the other active admins keeps two admins from demoting each other at once.
      const others = await tx.select({ id: users.id }).from(users)
        .where(and(eq(users.role, 'admin'), eq(users.disabled, false), ne(users.id, userId))).for('update');
      if (others.length === 0) throw conflict('Ergodic needs at least one active site admin: make someone else an admin first.');
    }
    await tx.update(users).set(changes).where(eq(users.id, userId));
    if (changes.disabled === true && !target.disabled) {
      await endSessionsOf(tx, userId);
      const revokedTokens = await revokeAllApiTokens(tx, userId, 'account_disabled');
      await recordAudit(tx, { projectId: null, actorId, action: 'user.disabled', details: { userId, revokedTokens } });
    }
    if (changes.disabled === false && target.disabled) {
      await recordAudit(tx, { projectId: null, actorId, action: 'user.enabled', details: { userId } });
    }
    if (changes.role && changes.role !== target.role) {
      await recordAudit(tx, { projectId: null, actorId, action: 'user.role_changed', details: { userId, from: target.role, to: changes.role } });
    }
  });
  const [row] = await db.select().from(users).where(eq(users.id, userId));
  return { id: row!.id, email: row!.email, displayName: row!.displayName, role: row!.role, disabled: row!.disabled, createdAt: row!.createdAt.toISOString() };
}
