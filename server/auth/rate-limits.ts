import type { Request, RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit, type Options } from 'express-rate-limit';
import type { Redis } from 'ioredis';
import { RedisStore } from 'rate-limit-redis';
import type { AppContext } from '../context.ts';
import { AppError } from '../errors.ts';
import { countersReady } from '../services/counters.ts';

/**
 * A Redis store that recovers after Redis comes back: the stock store keeps
 * the failed script load of an outage forever, so every later request would
 * fail too. Here a failure reloads the scripts on the next request.
 */
class RecoveringRedisStore extends RedisStore {
  override async init(options: Options): Promise<void> {
    await super.init(options).catch(() => this.forgetScripts());
  }

  override async increment(key: string) {
    try {
      return await super.increment(key);
    } catch (err) {
      this.forgetScripts();
      throw err;
    }
  }

  private forgetScripts(): void {
    this.incrementScriptSha = this.loadIncrementScript();
    this.getScriptSha = this.loadGetScript();
    this.incrementScriptSha.catch(() => {});
    this.getScriptSha.catch(() => {});
  }
}

interface LimitRule {
  /** Names the counter in Redis and the action in the message. */
  name: string;
  /** What is being limited, for the 429 message: "Too many <what>." */
  what: string;
  windowMs: number;
  limit: number;
  /** Whose count this is: the caller's address by default. */
  key?: (req: Request) => string;
}

const byAddress = (req: Request) => ipKeyGenerator(req.ip ?? 'unknown');
const byUser = (req: Request) => (req.user ? `user:${req.user.id}` : `address:${byAddress(req)}`);

function seconds(ms: number): string {
  const s = Math.max(1, Math.ceil(ms / 1000));
  return s < 120 ? `${s} seconds` : `${Math.ceil(s / 60)} minutes`;
}

/**
 * One limit, counted in Redis so every web node agrees. Over the limit the
 * request gets 429 saying how long to wait (and Retry-After); with Redis
 * away it gets the usual 503, never an unlimited pass.
 */
export function rateLimitFor(ctx: AppContext, rule: LimitRule): RequestHandler {
  const redis: Redis = ctx.counters;
  return rateLimit({
    windowMs: rule.windowMs,
    limit: Math.max(1, Math.round(rule.limit * ctx.config.RATE_LIMIT_FACTOR)),
    standardHeaders: 'draft-7',
    legacyHeaders: false,
    passOnStoreError: false,
    keyGenerator: rule.key ?? byAddress,
    store: new RecoveringRedisStore({
      prefix: `ergodic:rate:${rule.name}:`,
      sendCommand: async (command: string, ...args: string[]) => {
        await countersReady(redis);
        return redis.call(command, ...args) as Promise<number | string>;
      },
    }),
    handler: (req, _res, next) => {
      const info = (req as Request & { rateLimit?: { resetTime?: Date } }).rateLimit;
      const resetAt = info?.resetTime?.getTime() ?? Date.now() + rule.windowMs;
      const waitMs = Math.max(1000, resetAt - Date.now());
      next(new AppError(429, 'rate_limited', `Too many ${rule.what}. Try again in ${seconds(waitMs)}.`,
        { retryAfterSeconds: Math.ceil(waitMs / 1000) }));
    },
  });
}

const MINUTE = 60_000;
const HOUR = 60 * MINUTE;

const built = new WeakMap<AppContext, ReturnType<typeof buildLimits>>();

/** The limits of the API, by action, one set per app context; README "Security" lists them. */
export function apiRateLimits(ctx: AppContext): ReturnType<typeof buildLimits> {
  let limits = built.get(ctx);
  if (!limits) built.set(ctx, (limits = buildLimits(ctx)));
  return limits;
}

function buildLimits(ctx: AppContext) {
  const rule = (r: LimitRule) => rateLimitFor(ctx, r);
  return {
    registration: rule({ name: 'register', what: 'sign-ups from your network address', windowMs: HOUR, limit: 10 }),
    passwordReset: rule({ name: 'reset', what: 'password-reset requests from your network address', windowMs: HOUR, limit: 10 }),
    passwordResetConfirm: rule({ name: 'reset-confirm', what: 'password-reset attempts from your network address', windowMs: HOUR, limit: 20 }),
    invitations: rule({ name: 'invite', what: 'invitations sent from your account', windowMs: HOUR, limit: 20, key: byUser }),
    invitationsToOneAddress: rule({
      name: 'invite-to', what: 'invitations to this e-mail address', windowMs: HOUR, limit: 3,
      key: (req) => `to:${String((req.body as { email?: unknown } | undefined)?.email ?? '').trim().toLowerCase()}`,
    }),
    invitationReads: rule({ name: 'invite-read', what: 'invitation look-ups from your network address', windowMs: MINUTE, limit: 30 }),
    comments: rule({ name: 'comment', what: 'comments from your account', windowMs: 10 * MINUTE, limit: 20, key: byUser }),
    uploads: rule({ name: 'upload', what: 'uploads from your account', windowMs: HOUR, limit: 120, key: byUser }),
    accessLinkReads: rule({ name: 'link-read', what: 'access-link requests from your network address', windowMs: MINUTE, limit: 60 }),
  };
}
