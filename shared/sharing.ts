/** Access links and comments on a report: requests and answers. */
import { z } from 'zod';
import { ACCESS_LINK_MAX_DAYS, COMMENT_MAX_LENGTH } from './account-rules.ts';
import { isoDate, personRef, recordId, requiredText } from './api-fields.ts';

export const createAccessLinkBody = z.object({
  expiresInDays: z.number({ error: 'must be a number of days' }).int('must be a whole number of days')
    .min(1, 'must be at least 1 day').max(ACCESS_LINK_MAX_DAYS, `must be at most ${ACCESS_LINK_MAX_DAYS} days`),
}).strict();

export const accessLinkSchema = z.object({
  id: recordId,
  reportId: recordId,
  createdBy: z.string(),
  createdAt: isoDate,
  expiresAt: isoDate,
  revokedAt: isoDate.nullable(),
  /** `revoked` by a member, or stopped because its creator left the project (`creator_left`) or became a viewer (`creator_demoted`). */
  revokedReason: z.enum(['revoked', 'creator_left', 'creator_demoted']).nullable(),
  lastUsedAt: isoDate.nullable(),
});
export type AccessLinkView = z.infer<typeof accessLinkSchema>;
export type AccessLinkRevocation = NonNullable<AccessLinkView['revokedReason']>;

/** A link just made: the only time its token and address are ever shown. */
export const newAccessLinkSchema = z.object({
  id: recordId,
  reportId: recordId,
  token: z.string(),
  url: z.string(),
  expiresAt: isoDate,
});
export type NewAccessLink = z.infer<typeof newAccessLinkSchema>;

export const commentBody = z.object({ body: requiredText(COMMENT_MAX_LENGTH) }).strict();

export const commentSchema = z.object({
  id: recordId,
  body: z.string(),
  author: personRef,
  createdAt: isoDate,
});
export type ReportComment = z.infer<typeof commentSchema>;
