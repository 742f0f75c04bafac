import type { Redis } from 'ioredis';
import { serviceUnavailable } from '../outage.ts';

/**
 * Waits (briefly) for the counters connection to be usable: it refuses
 * commands while connecting rather than queueing them, which is what a
 * request wants during an outage but not in the first moment after start.
 */
export async function countersReady(redis: Redis, timeoutMs = 3_000): Promise<void> {
  if (redis.status === 'ready') return;
  await new Promise<void>((resolve, reject) => {
    const timer = setTimeout(() => {
      redis.off('ready', onReady);
      reject(serviceUnavailable('The counter store (Redis) is not reachable right now. Try again in a minute.'));
    }, timeoutMs);
    const onReady = () => {
      clearTimeout(timer);
      resolve();
    };
    redis.once('ready', onReady);
  });
}
