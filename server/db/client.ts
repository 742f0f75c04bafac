import { drizzle, type MySql2Database } from 'drizzle-orm/mysql2';
import mysql from 'mysql2/promise';
import * as schema from './schema/index.ts';

export type Database = MySql2Database<typeof schema>;

export interface DatabaseHandle {
  db: Database;
  pool: mysql.Pool;
  close(): Promise<void>;
}

export function connectDatabase(url: string): DatabaseHandle {
  const pool = mysql.createPool({ uri: url, connectionLimit: 10, timezone: 'Z', dateStrings: false });
  const db = drizzle(pool, { schema, mode: 'default' });
  return { db, pool, close: () => pool.end() };
}
