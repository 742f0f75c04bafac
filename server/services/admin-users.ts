import { and, asc, count, eq, ne } from 'drizzle-orm';
import type mysql from 'mysql2/promise';
import type { Database } from '../db/client.ts';
import { users } from '../db/schema/index.ts';
import { conflict, notFound } from '../errors.ts';
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
 * always keeps one active admin; a disabled account is signed out everywhere.
 */
export async function updateUser(db: Database, pool: mysql.Pool, actorId: number, userId: number, changes: AdminUserChanges): Promise<AdminUser> {
  const [target] = await db.select().from(users).where(eq(users.id, userId));
  if (!target) throw notFound('User');
  const losesAdmin = target.role === 'admin' && !target.disabled && (changes.role === 'member' || changes.disabled === true);
  if (losesAdmin) {
    const [others] = await db.select({ n: count() }).from(users)
      .where(and(eq(users.role, 'admin'), eq(users.disabled, false), ne(users.id, userId)));
    if ((others?.n ?? 0) === 0) throw conflict('Ergodic needs at least one active site admin: make someone else an admin first.');
  }
  await db.update(users).set(changes).where(eq(users.id, userId));
  if (changes.disabled === true) await endSessionsOf(pool, userId);
  if (changes.role && changes.role !== target.role) {
    await recordAudit(db, { projectId: null, actorId, action: 'user.role_changed', details: { userId, from: target.role, to: changes.role } });
  }
  if (changes.disabled !== undefined && changes.disabled !== target.disabled) {
    await recordAudit(db, { projectId: null, actorId, action: changes.disabled ? 'user.disabled' : 'user.enabled', details: { userId } });
  }
  const [row] = await db.select().from(users).where(eq(users.id, userId));
  return { id: row!.id, email: row!.email, displayName: row!.displayName, role: row!.role, disabled: row!.disabled, createdAt: row!.createdAt.toISOString() };
}
