import { sql } from 'drizzle-orm';
import type { Executor } from '../db/client.ts';

/**
 * Signs a user out everywhere (after a password reset or when an admin
 * disables the account). The store keeps session data as JSON text, with
 * passport's user id at $.passport.user. Takes a transaction, so it can be
 * one step of a larger change.
 */
export async function endSessionsOf(db: Executor, userId: number): Promise<void> {
  await db.execute(sql`DELETE FROM sessions WHERE JSON_VALUE(data, '$.passport.user') = ${String(userId)}`);
}
