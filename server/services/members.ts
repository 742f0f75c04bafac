import { and, asc, eq } from 'drizzle-orm';
import type { Database } from '../db/client.ts';
import { projectMembers, projects, users, type ProjectRole } from '../db/schema/index.ts';
import { conflict, notFound } from '../errors.ts';
import { recordAudit } from './audit.ts';
import type { Member } from '../../shared/projects.ts';
import { revokeLinksOfCreator } from './access-links.ts';

export async function listMembers(db: Database, projectId: number): Promise<Member[]> {
  const rows = await db.select({
    userId: users.id, email: users.email, displayName: users.displayName, role: projectMembers.role, joinedAt: projectMembers.createdAt,
  }).from(projectMembers).innerJoin(users, eq(users.id, projectMembers.userId))
    .where(eq(projectMembers.projectId, projectId)).orderBy(asc(projectMembers.createdAt), asc(users.id));
  return rows.map((r) => ({ ...r, joinedAt: r.joinedAt.toISOString() }));
}

type Change = { kind: 'role'; role: ProjectRole } | { kind: 'remove' };

/**
 * Applies a role change or removal with the project's owner rows locked, so
 * two owners demoting each other at once cannot leave the project ownerless.
 * A member who leaves, is removed, or drops to viewer can no longer share,
 * so the access links they made stop working in the same transaction, each
 * with an audit entry.
 */
async function changeMembership(db: Database, projectId: number, actorId: number, userId: number, change: Change): Promise<void> {
  await db.transaction(async (tx) => {
    const rows = await tx.select({ userId: projectMembers.userId, role: projectMembers.role }).from(projectMembers)
      .where(eq(projectMembers.projectId, projectId)).for('update');
    const target = rows.find((r) => r.userId === userId);
    if (!target) throw notFound('Member');
    const owners = rows.filter((r) => r.role === 'owner').length;
    const losesOwner = target.role === 'owner' && (change.kind === 'remove' || change.role !== 'owner');
    if (losesOwner && owners === 1) {
      throw conflict('A project needs at least one owner: make another member an owner first.');
    }
    const where = and(eq(projectMembers.projectId, projectId), eq(projectMembers.userId, userId));
    if (change.kind === 'remove') {
      await tx.delete(projectMembers).where(where);
      await recordAudit(tx, { projectId, actorId, action: actorId === userId ? 'member.left' : 'member.removed', details: { userId, role: target.role } });
      await revokeLinksOfCreator(tx, projectId, actorId, userId, 'creator_left');
    } else {
      await tx.update(projectMembers).set({ role: change.role }).where(where);
      await recordAudit(tx, { projectId, actorId, action: 'member.role_changed', details: { userId, from: target.role, to: change.role } });
      if (change.role === 'viewer' && target.role !== 'viewer') await revokeLinksOfCreator(tx, projectId, actorId, userId, 'creator_demoted');
    }
    await tx.update(projects).set({ lastActivityAt: new Date() }).where(eq(projects.id, projectId));
  });
}

export async function changeMemberRole(db: Database, projectId: number, actorId: number, userId: number, role: ProjectRole): Promise<void> {
  await changeMembership(db, projectId, actorId, userId, { kind: 'role', role });
}

export async function removeMember(db: Database, projectId: number, actorId: number, userId: number): Promise<void> {
  await changeMembership(db, projectId, actorId, userId, { kind: 'remove' });
}
