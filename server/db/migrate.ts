import { fileURLToPath } from 'node:url';
import { migrate } from 'drizzle-orm/mysql2/migrator';
import type { Database } from './client.ts';

const migrationsFolder = fileURLToPath(new URL('./migrations', import.meta.url));

/** Applies the committed SQL migrations; safe to run on every start. */
export async function runMigrations(db: Database): Promise<void> {
  await migrate(db, { migrationsFolder });
}
