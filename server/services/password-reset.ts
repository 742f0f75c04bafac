import { and, count, eq, gt, isNull } from 'drizzle-orm';
import type { CurrentUser } from '../auth/authorize.ts';
import { toCurrentUser } from '../auth/current-user.ts';
import { newSecretToken, sha256Hex } from '../auth/secret-token.ts';
import type { AppContext } from '../context.ts';
import { passwordResets, users } from '../db/schema/index.ts';
import { AppError, badRequest } from '../errors.ts';
import { passwordResetMail } from './account-mail.ts';
import { revokeAllApiTokens } from './api-tokens.ts';
import { recordAudit } from './audit.ts';
import { hashPassword } from './passwords.ts';
import { endSessionsOf } from './sessions.ts';
import { forgiveAccount } from './sign-in-limit.ts';

export const RESET_VALID_MINUTES = 60;
/** Caps reset e-mails per account, so the form cannot be used to flood someone's inbox. */
const RESETS_PER_HOUR = 3;

/**
 * Sends a single-use reset link if the e-mail belongs to an active account.
 * Callers answer the same either way, so the form does not reveal who has an account.
 */
export async function requestPasswordReset(ctx: AppContext, email: string, origin: string, now = new Date()): Promise<void> {
  const [user] = await ctx.db.select().from(users).where(eq(users.email, email));
  if (!user || user.disabled) return;
  const [recent] = await ctx.db.select({ n: count() }).from(passwordResets)
    .where(and(eq(passwordResets.userId, user.id), gt(passwordResets.createdAt, new Date(now.getTime() - 3_600_000))));
  if ((recent?.n ?? 0) >= RESETS_PER_HOUR) {
    ctx.log.warn({ userId: user.id }, 'password reset requested too often; no e-mail sent');
    return;
  }
  const { token, hash } = newSecretToken();
  await ctx.db.insert(passwordResets).values({
    userId: user.id, tokenHash: hash, expiresAt: new Date(now.getTime() + RESET_VALID_MINUTES * 60_000),
  });
  const link = `${origin}/reset-password?token=${encodeURIComponent(token)}`;
  await ctx.mailer.send(passwordResetMail(user.email, link, RESET_VALID_MINUTES));
}

/**
 * Sets a new password with a reset token, which then stops working. In one
 * transaction: the token is claimed, the password changed, the account's
 * other reset links, sessions and API tokens are ended, and its failed
 * sign-ins forgiven afterwards. Either all of it happens or none.
 */
export async function confirmPasswordReset(ctx: AppContext, token: string, password: string, now = new Date()): Promise<CurrentUser> {
  const tokenHash = sha256Hex(token);
  const [reset] = await ctx.db.select().from(passwordResets).where(eq(passwordResets.tokenHash, tokenHash));
  if (!reset) throw badRequest('This reset link is not valid. Ask for a new one.');
  if (reset.usedAt) throw new AppError(410, 'reset_used', 'This reset link was already used. Ask for a new one.');
  if (reset.expiresAt <= now) throw new AppError(410, 'reset_expired', 'This reset link has expired. Ask for a new one.');
  // Hashed before the transaction, so no row stays locked for the length of a deliberately slow hash.
  const passwordHash = await hashPassword(password);
  return ctx.db.transaction(async (tx) => {
    // The guarded update makes the token single-use even when two requests race.
    const [claimed] = await tx.update(passwordResets).set({ usedAt: now })
      .where(and(eq(passwordResets.id, reset.id), isNull(passwordResets.usedAt)));
    if (claimed.affectedRows !== 1) throw new AppError(410, 'reset_used', 'This reset link was already used. Ask for a new one.');
    const [user] = await tx.select().from(users).where(eq(users.id, reset.userId)).for('update');
    if (!user || user.disabled) throw new AppError(403, 'account_disabled', 'This account is disabled. A site admin can enable it again.');
    await tx.update(users).set({ passwordHash }).where(eq(users.id, user.id));
    await tx.update(passwordResets).set({ usedAt: now })
      .where(and(eq(passwordResets.userId, user.id), isNull(passwordResets.usedAt)));
    const revokedTokens = await revokeAllApiTokens(tx, user.id, 'password_reset', now);
    await endSessionsOf(tx, user.id);
    await recordAudit(tx, { projectId: null, actorId: user.id, action: 'user.password_reset', details: { revokedTokens } });
    return toCurrentUser(user);
  }).then(async (user) => {
    await forgiveAccount(ctx.counters, user.email).catch(() => {});
    return user;
  });
}
