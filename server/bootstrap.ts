import type { Config } from './config.ts';
import type { AppContext } from './context.ts';
import { connectDatabase } from './db/client.ts';
import { WorkQueue } from './jobs/queue.ts';
import { countersConnection } from './jobs/connection.ts';
import { createLogger } from './logger.ts';
import { Mailer } from './mail/mailer.ts';
import { ObjectStore } from './storage/object-store.ts';

export interface RunningContext extends AppContext {
  close(): Promise<void>;
}

/** Connects to the database, queue, store and mail relay named by the config. */
export function createContext(config: Config): RunningContext {
  const log = createLogger(config.LOG_LEVEL);
  const { db, pool, close: closeDb } = connectDatabase(config.DATABASE_URL);
  const store = ObjectStore.fromConfig(config);
  const mailer = Mailer.fromConfig(config);
  const queue = new WorkQueue(config.REDIS_URL, config.QUEUE_ADD_TIMEOUT_MS);
  const counters = countersConnection(config.REDIS_URL);
  // Reconnecting is ioredis's job; an error while Redis is away is answered per request.
  counters.on('error', () => {});
  return {
    config, log, db, pool, store, mailer, queue, counters,
    async close() {
      counters.disconnect();
      await queue.close();
      mailer.close();
      store.close();
      await closeDb();
    },
  };
}
