import type { Request } from 'express';
import { z } from 'zod';
import type { AppContext } from '../context.ts';
import { DISPLAY_NAME_MAX_LENGTH, PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from '../../shared/account-rules.ts';
import { projectRoles } from '../db/schema/index.ts';

/** Shared pieces of request schemas, so every route words the same rule the same way. */
export const emailField = z.string({ error: 'is required' }).trim().toLowerCase().max(254, 'must be at most 254 characters')
  .pipe(z.email('must be an e-mail address'));
export const passwordField = z.string({ error: 'is required' })
  .min(PASSWORD_MIN_LENGTH, `must be at least ${PASSWORD_MIN_LENGTH} characters`)
  .max(PASSWORD_MAX_LENGTH, `must be at most ${PASSWORD_MAX_LENGTH} characters`);
export const displayNameField = z.string({ error: 'is required' }).trim().min(1, 'must not be empty')
  .max(DISPLAY_NAME_MAX_LENGTH, `must be at most ${DISPLAY_NAME_MAX_LENGTH} characters`);
export const roleField = z.enum(projectRoles, { error: `must be one of ${projectRoles.join(', ')}` });
export const idField = z.coerce.number({ error: 'must be a number' }).int('must be a whole number').positive('must be positive');
export const tokenField = z.string().min(1, 'is required').max(200, 'is too long');

/** Parses path parameters; errors name the parameter. */
export function params<T extends z.ZodRawShape>(req: Request, shape: T): z.infer<z.ZodObject<T>> {
  return z.object(shape).parse(req.params);
}

/** Parses a JSON body; a missing body reads as `{}` so errors name the missing fields. */
export function body<T extends z.ZodType>(req: Request, schema: T): z.infer<T> {
  return schema.parse(req.body ?? {});
}

/** Where users reach the app, for links in e-mails: PUBLIC_URL when set, else this request's origin. */
export function appOrigin(ctx: AppContext, req: Request): string {
  return (ctx.config.PUBLIC_URL ?? `${req.protocol}://${req.get('host') ?? 'localhost'}`).replace(/\/+$/, '');
}
