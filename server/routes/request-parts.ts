import type { Request } from 'express';
import { z } from 'zod';
import { linkOrigin } from '../config.ts';
import type { AppContext } from '../context.ts';

/** `:id` and friends: positive integers only. */
export const idField = z.coerce.number({ error: 'must be a number' }).int('must be a whole number').positive('must be positive');

/** Parses path parameters; errors name the parameter. */
export function params<T extends z.ZodRawShape>(req: Request, shape: T): z.infer<z.ZodObject<T>> {
  return z.object(shape).parse(req.params);
}

/** Parses a JSON body; a missing body reads as `{}` so errors name the missing fields. */
export function body<T extends z.ZodType>(req: Request, schema: T): z.infer<T> {
  return schema.parse(req.body ?? {});
}

/** Parses the query string (read-only in Express 5, so the parsed value is returned, not stored). */
export function query<T extends z.ZodType>(req: Request, schema: T): z.infer<T> {
  return schema.parse(req.query);
}

/** Where users reach the app, for links: from configuration only, never a request header (see `linkOrigin`). */
export function appOrigin(ctx: AppContext): string {
  return linkOrigin(ctx.config);
}
