import { and, count, eq, gt, min } from 'drizzle-orm';
import type { Database, Executor } from '../db/client.ts';
import { signInAttempts } from '../db/schema/index.ts';
import { AppError } from '../errors.ts';

/** Failed attempts allowed per window, counted in MariaDB so every web node agrees. */
export const SIGN_IN_LIMITS = { perAccount: 5, perAddress: 30, windowMinutes: 15 } as const;

function windowStart(now: Date): Date {
  return new Date(now.getTime() - SIGN_IN_LIMITS.windowMinutes * 60_000);
}

function minutesLeft(oldest: Date | null, now: Date): number {
  const until = (oldest?.getTime() ?? now.getTime()) + SIGN_IN_LIMITS.windowMinutes * 60_000;
  return Math.max(1, Math.ceil((until - now.getTime()) / 60_000));
}

/** Refuses with 429 while the account or the address has too many recent failures. */
export async function assertSignInAllowed(db: Database, email: string, ip: string, now = new Date()): Promise<void> {
  const since = windowStart(now);
  const [byAccount] = await db.select({ n: count(), oldest: min(signInAttempts.createdAt) }).from(signInAttempts)
    .where(and(eq(signInAttempts.email, email), gt(signInAttempts.createdAt, since)));
  if (byAccount && byAccount.n >= SIGN_IN_LIMITS.perAccount) {
    const wait = minutesLeft(byAccount.oldest, now);
    throw new AppError(429, 'too_many_attempts',
      `Too many failed sign-ins for this account. Try again in ${wait} minute${wait === 1 ? '' : 's'}, or reset your password.`,
      { retryAfterSeconds: wait * 60 });
  }
  const [byAddress] = await db.select({ n: count(), oldest: min(signInAttempts.createdAt) }).from(signInAttempts)
    .where(and(eq(signInAttempts.ip, ip), gt(signInAttempts.createdAt, since)));
  if (byAddress && byAddress.n >= SIGN_IN_LIMITS.perAddress) {
    const wait = minutesLeft(byAddress.oldest, now);
    throw new AppError(429, 'too_many_attempts',
      `Too many failed sign-ins from your network address. Try again in ${wait} minute${wait === 1 ? '' : 's'}.`,
      { retryAfterSeconds: wait * 60 });
  }
}

export async function recordSignInFailure(db: Database, email: string, ip: string): Promise<void> {
  await db.insert(signInAttempts).values({ email, ip: ip.slice(0, 64) });
}

/** A successful sign-in forgives the account's earlier failures. */
export async function clearSignInFailures(db: Executor, email: string): Promise<void> {
  await db.delete(signInAttempts).where(eq(signInAttempts.email, email));
}
