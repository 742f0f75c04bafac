import { eq } from 'drizzle-orm';
import type { Database } from '../db/client.ts';
import { users, type UserRow } from '../db/schema/index.ts';
import type { CurrentUser } from './authorize.ts';

export function toCurrentUser(row: Pick<UserRow, 'id' | 'email' | 'displayName' | 'role'>): CurrentUser {
  return { id: row.id, email: row.email, displayName: row.displayName, role: row.role };
}

/** The user behind a session or token, or null once the account is gone or disabled. */
export async function loadActiveUser(db: Database, id: number): Promise<CurrentUser | null> {
  const [row] = await db.select().from(users).where(eq(users.id, id));
  return row && !row.disabled ? toCurrentUser(row) : null;
}
