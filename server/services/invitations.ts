import { and, asc, eq, gt, isNull } from 'drizzle-orm';
import type { CurrentUser } from '../auth/authorize.ts';
import { newSecretToken, sha256Hex } from '../auth/secret-token.ts';
import type { AppContext } from '../context.ts';
import type { Database } from '../db/client.ts';
import { invitations, projectMembers, projects, users, type ProjectRole } from '../db/schema/index.ts';
import { AppError, conflict, notFound } from '../errors.ts';
import { INVITATION_DAYS } from '../../shared/account-rules.ts';
import { invitationMail } from './account-mail.ts';
import { recordAudit } from './audit.ts';
import type { InvitationFacts, PendingInvitation } from '../../shared/projects.ts';

export interface NewInvitation {
  projectId: number;
  actor: CurrentUser;
  email: string;
  role: ProjectRole;
  /** Where the app is reached, for the link in the e-mail. */
  origin: string;
}

/** Invites an e-mail address; a newer invitation to the same address replaces the pending one. */
export async function createInvitation(ctx: AppContext, invite: NewInvitation, now = new Date()): Promise<PendingInvitation> {
  const { db } = ctx;
  const [member] = await db.select({ id: users.id }).from(projectMembers).innerJoin(users, eq(users.id, projectMembers.userId))
    .where(and(eq(projectMembers.projectId, invite.projectId), eq(users.email, invite.email)));
  if (member) throw conflict(`${invite.email} is already a member of this project.`);
  const [project] = await db.select({ name: projects.name }).from(projects).where(eq(projects.id, invite.projectId));
  if (!project) throw notFound('Project');

  const { token, hash } = newSecretToken();
  const expiresAt = new Date(now.getTime() + INVITATION_DAYS * 86_400_000);
  // The older pending invitation is withdrawn only together with the new one being made.
  const id = await db.transaction(async (tx) => {
    await tx.update(invitations).set({ revokedAt: now }).where(and(eq(invitations.projectId, invite.projectId),
      eq(invitations.email, invite.email), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)));
    const [{ id: invitationId }] = await tx.insert(invitations).values({
      projectId: invite.projectId, email: invite.email, role: invite.role, tokenHash: hash, invitedBy: invite.actor.id, expiresAt,
    }).$returningId();
    return invitationId;
  });
  try {
    await ctx.mailer.send(invitationMail({
      to: invite.email, link: `${invite.origin}/invitations/${encodeURIComponent(token)}`, projectName: project.name,
      role: invite.role, inviterName: invite.actor.displayName, validDays: INVITATION_DAYS,
    }));
  } catch (err) {
    await db.delete(invitations).where(eq(invitations.id, id));
    ctx.log.error({ err }, 'invitation e-mail could not be sent');
    throw new AppError(502, 'mail_unavailable', 'The invitation e-mail could not be sent, so no invitation was made. Try again later.');
  }
  await recordAudit(db, { projectId: invite.projectId, actorId: invite.actor.id, action: 'invitation.sent', details: { invitationId: id, email: invite.email, role: invite.role } });
  return { id, email: invite.email, role: invite.role, invitedBy: invite.actor.displayName, createdAt: now.toISOString(), expiresAt: expiresAt.toISOString() };
}

/** Invitations that can still be accepted. */
export async function listPendingInvitations(db: Database, projectId: number, now = new Date()): Promise<PendingInvitation[]> {
  const rows = await db.select({
    id: invitations.id, email: invitations.email, role: invitations.role, invitedBy: users.displayName,
    createdAt: invitations.createdAt, expiresAt: invitations.expiresAt,
  }).from(invitations).innerJoin(users, eq(users.id, invitations.invitedBy))
    .where(and(eq(invitations.projectId, projectId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, now)))
    .orderBy(asc(invitations.createdAt));
  return rows.map((r) => ({ ...r, createdAt: r.createdAt.toISOString(), expiresAt: r.expiresAt.toISOString() }));
}

export async function revokeInvitation(db: Database, projectId: number, actorId: number, invitationId: number): Promise<void> {
  const [result] = await db.update(invitations).set({ revokedAt: new Date() }).where(and(eq(invitations.id, invitationId),
    eq(invitations.projectId, projectId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)));
  if (result.affectedRows !== 1) throw notFound('Pending invitation');
  await recordAudit(db, { projectId, actorId, action: 'invitation.revoked', details: { invitationId } });
}

async function findUsable(db: Database, token: string, now: Date) {
  const [row] = await db.select({ invitation: invitations, projectName: projects.name, invitedBy: users.displayName })
    .from(invitations).innerJoin(projects, eq(projects.id, invitations.projectId)).innerJoin(users, eq(users.id, invitations.invitedBy))
    .where(eq(invitations.tokenHash, sha256Hex(token)));
  if (!row) throw notFound('Invitation');
  const { invitation } = row;
  if (invitation.acceptedAt) throw new AppError(410, 'invitation_used', 'This invitation was already accepted. Ask a project owner for a new one if you need it.');
  if (invitation.revokedAt) throw new AppError(410, 'invitation_revoked', 'This invitation was withdrawn by a project owner.');
  if (invitation.expiresAt <= now) throw new AppError(410, 'invitation_expired', 'This invitation has expired. Ask a project owner to invite you again.');
  return row;
}

/** What the accept page shows before anyone signs in: the token itself is the proof of invitation. */
export async function describeInvitation(db: Database, token: string, now = new Date()): Promise<InvitationFacts> {
  const { invitation, projectName, invitedBy } = await findUsable(db, token, now);
  return { projectName, email: invitation.email, role: invitation.role, invitedBy, expiresAt: invitation.expiresAt.toISOString() };
}

/** Joins the invited project; the token works once and only for the account with the invited e-mail. */
export async function acceptInvitation(db: Database, token: string, user: CurrentUser, now = new Date()): Promise<{ projectId: number }> {
  const { invitation } = await findUsable(db, token, now);
  if (invitation.email !== user.email) {
    throw conflict(`This invitation was sent to ${invitation.email}, but you are signed in as ${user.email}. Sign in with the invited address to accept it.`);
  }
  await db.transaction(async (tx) => {
    const [claimed] = await tx.update(invitations).set({ acceptedAt: now })
      .where(and(eq(invitations.id, invitation.id), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)));
    if (claimed.affectedRows !== 1) throw new AppError(410, 'invitation_used', 'This invitation was already accepted.');
    const [existing] = await tx.select({ role: projectMembers.role }).from(projectMembers)
      .where(and(eq(projectMembers.projectId, invitation.projectId), eq(projectMembers.userId, user.id)));
    if (!existing) await tx.insert(projectMembers).values({ projectId: invitation.projectId, userId: user.id, role: invitation.role });
    await recordAudit(tx, { projectId: invitation.projectId, actorId: user.id, action: 'member.joined', details: { invitationId: invitation.id, role: invitation.role } });
    await tx.update(projects).set({ lastActivityAt: now }).where(eq(projects.id, invitation.projectId));
  });
  return { projectId: invitation.projectId };
}
