import type { Config } from './config.ts';
import type { Database } from './db/client.ts';
import type { WorkQueue } from './jobs/queue.ts';
import type { Logger } from './logger.ts';
import type { Mailer } from './mail/mailer.ts';
import type { ObjectStore } from './storage/object-store.ts';
import type mysql from 'mysql2/promise';

/** What every router and service may reach; built once per process. */
export interface AppContext {
  config: Config;
  log: Logger;
  db: Database;
  pool: mysql.Pool;
  store: ObjectStore;
  mailer: Mailer;
  queue: WorkQueue;
}
