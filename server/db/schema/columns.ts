import { sql } from 'drizzle-orm';
import { datetime, int } from 'drizzle-orm/mysql-core';

/** Millisecond timestamps, set by the database on insert. */
export const createdAt = () => datetime('created_at', { mode: 'date', fsp: 3 }).notNull().default(sql`CURRENT_TIMESTAMP(3)`);
export const timestamp = (name: string) => datetime(name, { mode: 'date', fsp: 3 });
export const id = () => int('id').autoincrement().primaryKey();
export const ref = (name: string) => int(name).notNull();
