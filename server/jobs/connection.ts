import { Redis } from 'ioredis';

/** BullMQ wants its own connection per Queue/Worker, with retries left to it. */
export function redisConnection(url: string): Redis {
  return new Redis(url, { maxRetriesPerRequest: null, enableReadyCheck: true, lazyConnect: false });
}

/**
 * For counters read on a request's path (sign-in attempts, rate limits):
 * no offline queue and one retry, so a command fails fast while Redis is
 * away and the request can answer 503; ioredis keeps reconnecting meanwhile.
 */
export function countersConnection(url: string): Redis {
  return new Redis(url, { maxRetriesPerRequest: 1, enableOfflineQueue: false, connectTimeout: 3_000 });
}
