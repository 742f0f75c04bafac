/** Accounts, sign-in and personal API tokens: what the browser and scripts send and get back. */
import { z } from 'zod';
import { DISPLAY_NAME_MAX_LENGTH, PASSWORD_MAX_LENGTH, PASSWORD_MIN_LENGTH } from './account-rules.ts';
import { isoDate, nameText, recordId } from './api-fields.ts';

export const SITE_ROLES = ['admin', 'member'] as const;
export type SiteRole = (typeof SITE_ROLES)[number];

export const emailField = z.string({ error: 'is required' }).trim().toLowerCase().max(254, 'must be at most 254 characters')
  .pipe(z.email('must be an e-mail address'));
export const passwordField = z.string({ error: 'is required' })
  .min(PASSWORD_MIN_LENGTH, `must be at least ${PASSWORD_MIN_LENGTH} characters`)
  .max(PASSWORD_MAX_LENGTH, `must be at most ${PASSWORD_MAX_LENGTH} characters`);
export const displayNameField = nameText(DISPLAY_NAME_MAX_LENGTH);
/** Single-use secrets arriving in a path or a body (reset, invitation, access link). */
export const secretTokenField = z.string().min(1, 'is required').max(200, 'is too long');

export const registerBody = z.object({ email: emailField, password: passwordField, displayName: displayNameField }).strict();
export const signInBody = z.object({ email: emailField, password: z.string({ error: 'is required' }).min(1, 'is required').max(1000) }).strict();
export const passwordResetBody = z.object({ email: emailField }).strict();
export const passwordResetConfirmBody = z.object({ token: secretTokenField, password: passwordField }).strict();

/** The signed-in person, as /api/auth routes return them. */
export const signedInUserSchema = z.object({
  id: recordId,
  email: z.string(),
  displayName: z.string(),
  /** Site role: admins manage accounts; project rights come from project roles. */
  role: z.enum(SITE_ROLES),
});
export type SignedInUser = z.infer<typeof signedInUserSchema>;

export const noticeSchema = z.string().meta({ description: 'A sentence to show the user.' });

/** Longest lifetime a token may be given; without one it works until revoked. */
export const TOKEN_MAX_DAYS = 366;
export const createTokenBody = z.object({
  name: nameText(120),
  expiresInDays: z.number({ error: 'must be a number of days' }).int('must be a whole number of days')
    .min(1, 'must be at least 1 day').max(TOKEN_MAX_DAYS, `must be at most ${TOKEN_MAX_DAYS} days`).optional(),
}).strict();

export const TOKEN_REVOCATION_REASONS = ['owner', 'password_reset', 'account_disabled'] as const;

export const apiTokenSchema = z.object({
  id: recordId,
  name: z.string(),
  /** The first characters, to tell tokens apart; never enough to use one. */
  prefix: z.string(),
  createdAt: isoDate,
  lastUsedAt: isoDate.nullable(),
  /** When it stops working by itself; null for never. */
  expiresAt: isoDate.nullable(),
  revokedAt: isoDate.nullable(),
  /** Who or what stopped it: its owner, a password reset, or the account being disabled. */
  revokedReason: z.enum(TOKEN_REVOCATION_REASONS).nullable(),
});
export type ApiToken = z.infer<typeof apiTokenSchema>;

export const newApiTokenSchema = apiTokenSchema.extend({
  /** The secret itself: returned once, at creation. */
  token: z.string(),
});
export type NewApiToken = z.infer<typeof newApiTokenSchema>;
