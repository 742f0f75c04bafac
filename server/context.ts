import type { Config } from './config.ts';
import type { Database } from './db/client.ts';
import type { WorkQueue } from './jobs/queue.ts';
import type { Logger } from './logger.ts';
import type { Mailer } from './mail/mailer.ts';
import type { ObjectStore } from './storage/object-store.ts';
import type mysql from 'mysql2/promise';
import type { Redis } from 'ioredis';

/** What every router and service may reach; built once per process. */
export interface AppContext {
  config: Config;
  log: Logger;
  db: Database;
  pool: mysql.Pool;
  store: ObjectStore;
  mailer: Mailer;
  queue: WorkQueue;
  /**
   * Redis for counters every web node must agree on (sign-in attempts, rate
   * limits). Commands fail at once while Redis is away instead of queueing,
   * so a request gets a 503 rather than hanging.
   */
  counters: Redis;
}
