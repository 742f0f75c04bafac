/** Projects, their members, invitations and audit log: requests and answers. */
import { z } from 'zod';
import { PROJECT_DESCRIPTION_MAX_LENGTH, PROJECT_NAME_MAX_LENGTH } from './account-rules.ts';
import { emailField } from './accounts.ts';
import { isoDate, nameText, recordId } from './api-fields.ts';

export const PROJECT_ROLES = ['owner', 'editor', 'viewer'] as const;
export type ProjectRole = (typeof PROJECT_ROLES)[number];
export const roleField = z.enum(PROJECT_ROLES, { error: `must be one of ${PROJECT_ROLES.join(', ')}` });

const projectName = nameText(PROJECT_NAME_MAX_LENGTH);
const projectDescription = z.string({ error: 'must be text' }).trim()
  .max(PROJECT_DESCRIPTION_MAX_LENGTH, `must be at most ${PROJECT_DESCRIPTION_MAX_LENGTH} characters`);

export const createProjectBody = z.object({ name: projectName, description: projectDescription.default('') }).strict();
export const updateProjectBody = z.object({ name: projectName.optional(), description: projectDescription.optional() }).strict()
  .refine((b) => b.name !== undefined || b.description !== undefined, 'send name, description or both');
export const deleteProjectBody = z.object({ confirm: z.string({ error: "is required: type the project's name" }) }).strict();
export type ProjectChanges = z.infer<typeof updateProjectBody>;

export const projectSchema = z.object({
  id: recordId,
  name: z.string(),
  description: z.string(),
  /** The caller's role in the project. */
  role: z.enum(PROJECT_ROLES),
  memberCount: z.number().int(),
  /** Bytes the project's trajectories take in the object store: uploads and their binary frame stores. */
  storageBytes: z.number().int(),
  createdAt: isoDate,
  lastActivityAt: isoDate,
});
export type ProjectSummary = z.infer<typeof projectSchema>;

export const memberRoleBody = z.object({ role: roleField }).strict();

export const memberSchema = z.object({
  userId: recordId,
  email: z.string(),
  displayName: z.string(),
  role: z.enum(PROJECT_ROLES),
  joinedAt: isoDate,
});
export type Member = z.infer<typeof memberSchema>;

export const inviteBody = z.object({ email: emailField, role: roleField }).strict();

export const pendingInvitationSchema = z.object({
  id: recordId,
  email: z.string(),
  role: z.enum(PROJECT_ROLES),
  invitedBy: z.string(),
  createdAt: isoDate,
  expiresAt: isoDate,
});
export type PendingInvitation = z.infer<typeof pendingInvitationSchema>;

/** What an invitation link offers, shown before it is accepted. */
export const invitationFactsSchema = z.object({
  projectName: z.string(),
  email: z.string(),
  role: z.enum(PROJECT_ROLES),
  invitedBy: z.string(),
  expiresAt: isoDate,
});
export type InvitationFacts = z.infer<typeof invitationFactsSchema>;

export const auditEntrySchema = z.object({
  id: recordId,
  action: z.string(),
  details: z.record(z.string(), z.unknown()),
  actor: z.object({ id: recordId, displayName: z.string(), email: z.string() }).nullable(),
  /** What the entry's ids name today: the report's title, the series' name, the member's name; null once deleted or when the entry names none. */
  names: z.object({ report: z.string().nullable(), series: z.string().nullable(), member: z.string().nullable() }),
  createdAt: isoDate,
});
export type AuditEntry = z.infer<typeof auditEntrySchema>;
