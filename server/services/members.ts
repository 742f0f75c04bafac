import { and, asc, eq } from 'drizzle-orm';
import type { Database } from '../db/client.ts';
import { projectMembers, users, type ProjectRole } from '../db/schema/index.ts';
import { conflict, notFound } from '../errors.ts';
import { recordAudit } from './audit.ts';
import { touchProject } from './projects.ts';
import type { Member } from '../../shared/projects.ts';

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
 */
async function changeMembership(db: Database, projectId: number, userId: number, change: Change): Promise<ProjectRole> {
  return db.transaction(async (tx) => {
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
    if (change.kind === 'remove') await tx.delete(projectMembers).where(where);
    else await tx.update(projectMembers).set({ role: change.role }).where(where);
    return target.role;
  });
}

export async function changeMemberRole(db: Database, projectId: number, actorId: number, userId: number, role: ProjectRole): Promise<void> {
  const previous = await changeMembership(db, projectId, userId, { kind: 'role', role });
  await recordAudit(db, { projectId, actorId, action: 'member.role_changed', details: { userId, from: previous, to: role } });
  await touchProject(db, projectId);
}

export async function removeMember(db: Database, projectId: number, actorId: number, userId: number): Promise<void> {
  const previous = await changeMembership(db, projectId, userId, { kind: 'remove' });
  const action = actorId === userId ? 'member.left' : 'member.removed';
  await recordAudit(db, { projectId, actorId, action, details: { userId, role: previous } });
  await touchProject(db, projectId);
}
