import { eq, min } from 'drizzle-orm';
import type { CurrentUser } from '../auth/authorize.ts';
import { toCurrentUser } from '../auth/current-user.ts';
import type { Database } from '../db/client.ts';
import { users } from '../db/schema/index.ts';
import { conflict } from '../errors.ts';
import { hashPassword } from './passwords.ts';

export interface NewAccount {
  email: string;
  password: string;
  displayName: string;
}

function isDuplicateKey(err: unknown): boolean {
  const cause = err instanceof Error && 'cause' in err ? err.cause : err;
  return typeof cause === 'object' && cause !== null && 'code' in cause && cause.code === 'ER_DUP_ENTRY';
}

/** Creates a member account; the very first account on an instance becomes its site admin. */
export async function registerUser(db: Database, account: NewAccount): Promise<CurrentUser> {
  const taken = () => conflict('An account with this e-mail already exists. Sign in, or reset its password.');
  const [existing] = await db.select({ id: users.id }).from(users).where(eq(users.email, account.email));
  if (existing) throw taken();
  let id: number;
  try {
    [{ id }] = await db.insert(users).values({
      email: account.email, displayName: account.displayName, passwordHash: await hashPassword(account.password),
    }).$returningId();
  } catch (err) {
    if (isDuplicateKey(err)) throw taken();
    throw err;
  }
  // Decided after the insert, so two simultaneous first sign-ups cannot both become admin.
  const [first] = await db.select({ id: min(users.id) }).from(users);
  if (first?.id === id) await db.update(users).set({ role: 'admin' }).where(eq(users.id, id));
  const [row] = await db.select().from(users).where(eq(users.id, id));
  return toCurrentUser(row!);
}
