import { createHash } from 'node:crypto';
import type { Redis } from 'ioredis';
import { AppError } from '../errors.ts';
import { countersReady } from './counters.ts';

/**
 * Sign-in attempts allowed per 15-minute window, counted in Redis so every
 * web node agrees. The tightest limit is on one account from one address:
 * that stops a guesser without locking the owner out, who signs in from
 * elsewhere. The address as a whole is held harder than the account, whose
 * own limit only stops guessing spread over many addresses.
 */
export const SIGN_IN_LIMITS = { perAccountAndAddress: 5, perAddress: 30, perAccount: 100, windowMinutes: 15 } as const;

const PREFIX = 'ergodic:sign-in:';

/** Counts all three at once, setting each window on its first attempt; returns counts and milliseconds left. */
const COUNT_SCRIPT = `
local out = {}
for i = 1, #KEYS do
  local n = redis.call('INCR', KEYS[i])
  if n == 1 then redis.call('PEXPIRE', KEYS[i], ARGV[1]) end
  out[i] = n
  out[#KEYS + i] = redis.call('PTTL', KEYS[i])
end
return out`;

function keysFor(email: string, ip: string): [string, string, string] {
  const account = createHash('sha256').update(email).digest('hex').slice(0, 32);
  return [`${PREFIX}pair:${account}:${ip}`, `${PREFIX}address:${ip}`, `${PREFIX}account:${account}`];
}

function tooMany(message: string, msLeft: number): AppError {
  const seconds = Math.max(1, Math.ceil(msLeft / 1000));
  const minutes = Math.ceil(seconds / 60);
  return new AppError(429, 'too_many_attempts', `${message} Try again in ${minutes} minute${minutes === 1 ? '' : 's'}.`, { retryAfterSeconds: seconds });
}

/**
 * Counts this attempt before any password is checked, in one atomic step,
 * so concurrent attempts cannot all slip past the count; refuses with 429
 * when over a limit. A refused attempt is not held against the account,
 * only against the address that keeps trying.
 */
export async function countSignInAttempt(redis: Redis, email: string, ip: string): Promise<void> {
  await countersReady(redis);
  const keys = keysFor(email, ip);
  const out = await redis.eval(COUNT_SCRIPT, keys.length, ...keys, String(SIGN_IN_LIMITS.windowMinutes * 60_000)) as number[];
  const [pair, address, account, pairTtl, addressTtl, accountTtl] = out as [number, number, number, number, number, number];
  const refuse = (err: AppError) => redis.decr(keys[2]).then(() => { throw err; });
  if (address > SIGN_IN_LIMITS.perAddress) {
    await refuse(tooMany('Too many sign-in attempts from your network address.', addressTtl));
  }
  if (pair > SIGN_IN_LIMITS.perAccountAndAddress) {
    await refuse(tooMany('Too many failed sign-ins for this account from your network address. Reset your password if you have forgotten it.', pairTtl));
  }
  if (account > SIGN_IN_LIMITS.perAccount) {
    await refuse(tooMany('Too many failed sign-ins for this account from many addresses; it is protected for a while.', accountTtl));
  }
}

/** A successful sign-in is not a failure: it forgives this address's failures on the account and is not counted. */
export async function forgiveSignIn(redis: Redis, email: string, ip: string): Promise<void> {
  const [pair, address, account] = keysFor(email, ip);
  await redis.multi().del(pair).decr(address).decr(account).exec();
}

/** After a password reset the owner starts afresh from every address they used (the account-wide count stays). */
export async function forgiveAccount(redis: Redis, email: string): Promise<void> {
  const account = createHash('sha256').update(email).digest('hex').slice(0, 32);
  const pairs: string[] = [];
  let cursor = '0';
  do {
    const [next, keys] = await redis.scan(cursor, 'MATCH', `${PREFIX}pair:${account}:*`, 'COUNT', 200);
    pairs.push(...keys);
    cursor = next;
  } while (cursor !== '0');
  if (pairs.length) await redis.del(...pairs);
}
