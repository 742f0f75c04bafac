import type { ExtractTablesWithRelations } from 'drizzle-orm';
import type { MySqlDatabase } from 'drizzle-orm/mysql-core';
import { drizzle, type MySql2Database, type MySql2PreparedQueryHKT, type MySql2QueryResultHKT } from 'drizzle-orm/mysql2';
import mysql from 'mysql2/promise';
import * as schema from './schema/index.ts';

export type Database = MySql2Database<typeof schema>;
/** The database or a transaction on it: what a step of a multi-step write takes. */
export type Executor = MySqlDatabase<MySql2QueryResultHKT, MySql2PreparedQueryHKT, typeof schema, ExtractTablesWithRelations<typeof schema>>;

export interface DatabaseHandle {
  db: Database;
  pool: mysql.Pool;
  close(): Promise<void>;
}

export function connectDatabase(url: string): DatabaseHandle {
  // connectTimeout bounds how long a request waits on a database that is down, so it gets a 503 rather than hanging.
  const pool = mysql.createPool({ uri: url, connectionLimit: 10, timezone: 'Z', dateStrings: false, connectTimeout: 5_000 });
  const db = drizzle(pool, { schema, mode: 'default' });
  return { db, pool, close: () => pool.end() };
}
