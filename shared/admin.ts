/** Site administration: accounts and, on development instances, the mail the SMTP fake kept. */
import { z } from 'zod';
import { SITE_ROLES } from './accounts.ts';
import { isoDate, recordId } from './api-fields.ts';

export const adminUserSchema = z.object({
  id: recordId,
  email: z.string(),
  displayName: z.string(),
  role: z.enum(SITE_ROLES),
  disabled: z.boolean(),
  createdAt: isoDate,
});
export type AdminUser = z.infer<typeof adminUserSchema>;

export const adminUserChangesBody = z.object({
  role: z.enum(SITE_ROLES, { error: 'must be admin or member' }).optional(),
  disabled: z.boolean({ error: 'must be true or false' }).optional(),
}).strict().refine((c) => c.role !== undefined || c.disabled !== undefined, 'send role, disabled or both');
export type AdminUserChanges = z.infer<typeof adminUserChangesBody>;

export const sentMailSchema = z.object({
  /** The .eml file name; messages sort by it, oldest first. */
  id: z.string(),
  to: z.string(),
  subject: z.string(),
  date: isoDate.nullable(),
  text: z.string(),
});
export type SentMail = z.infer<typeof sentMailSchema>;
