import { eq } from 'drizzle-orm';
import type { CurrentUser } from '../auth/authorize.ts';
import { toCurrentUser } from '../auth/current-user.ts';
import type { AppContext } from '../context.ts';
import { users } from '../db/schema/index.ts';
import { AppError, unauthorized } from '../errors.ts';
import { hashPassword, verifyPassword } from './passwords.ts';
import { countSignInAttempt, forgiveSignIn } from './sign-in-limit.ts';

export interface Credentials {
  email: string;
  password: string;
  ip: string;
}

let decoyHash: Promise<string> | undefined;

/** Verifying against a decoy keeps an unknown e-mail as slow as a wrong password. */
function decoy(): Promise<string> {
  decoyHash ??= hashPassword('ergodic-decoy-password');
  return decoyHash;
}

/**
 * The user these credentials belong to; 401 when wrong, 429 when
 * rate-limited, 403 when disabled. The attempt is counted before the
 * (deliberately slow) password check, so bursts are limited as they arrive.
 */
export async function checkCredentials(ctx: Pick<AppContext, 'db' | 'counters'>, { email, password, ip }: Credentials): Promise<CurrentUser> {
  const normalised = email.trim().toLowerCase();
  await countSignInAttempt(ctx.counters, normalised, ip);
  const [row] = await ctx.db.select().from(users).where(eq(users.email, normalised));
  const matches = await verifyPassword(password, row?.passwordHash ?? await decoy());
  if (!row || !matches) throw unauthorized('Wrong e-mail or password.');
  if (row.disabled) throw new AppError(403, 'account_disabled', 'This account is disabled. A site admin can enable it again.');
  await forgiveSignIn(ctx.counters, normalised, ip).catch(() => {});
  return toCurrentUser(row);
}
