import { Redis } from 'ioredis';

/** BullMQ wants its own connection per Queue/Worker, with retries left to it. */
export function redisConnection(url: string): Redis {
  return new Redis(url, { maxRetriesPerRequest: null, enableReadyCheck: true, lazyConnect: false });
}
