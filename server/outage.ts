import { AppError } from './errors.ts';

/** How long a client is told to wait before trying again after an outage. */
export const OUTAGE_RETRY_AFTER_SECONDS = 30;

const NETWORK_CODES = new Set([
  'ECONNREFUSED', 'ECONNRESET', 'ETIMEDOUT', 'EPIPE', 'EHOSTUNREACH', 'ENETUNREACH', 'ENOTFOUND', 'EAI_AGAIN',
  'PROTOCOL_CONNECTION_LOST', 'PROTOCOL_SEQUENCE_TIMEOUT', 'ER_CON_COUNT_ERROR', 'ER_SERVER_SHUTDOWN', 'CR_SERVER_GONE_ERROR',
]);
const NETWORK_NAMES = new Set(['MaxRetriesPerRequestError', 'TimeoutError']);
const NETWORK_MESSAGES = /Connection is closed|connect ECONNREFUSED|Pool is closed|Can't add new command when connection is in closed state|Stream isn't writeable|socket hang up/i;

/**
 * Whether an error means a backing service (MariaDB, Redis, the object
 * store, the mail relay) is not reachable, rather than a fault of the
 * request or of our code. Drivers wrap the network error at various
 * depths, so the cause chain and aggregate errors are searched too.
 */
export function isOutage(err: unknown, depth = 0): boolean {
  if (!err || typeof err !== 'object' || depth > 6) return false;
  const e = err as { code?: unknown; name?: unknown; message?: unknown; cause?: unknown; errors?: unknown };
  if (typeof e.code === 'string' && NETWORK_CODES.has(e.code)) return true;
  if (typeof e.name === 'string' && NETWORK_NAMES.has(e.name)) return true;
  if (typeof e.message === 'string' && NETWORK_MESSAGES.test(e.message)) return true;
  if (Array.isArray(e.errors) && e.errors.some((inner) => isOutage(inner, depth + 1))) return true;
  return isOutage(e.cause, depth + 1);
}

export function serviceUnavailable(message = 'A service Ergodic depends on is not reachable right now. Try again in a minute.'): AppError {
  return new AppError(503, 'service_unavailable', message, { retryAfterSeconds: OUTAGE_RETRY_AFTER_SECONDS });
}
