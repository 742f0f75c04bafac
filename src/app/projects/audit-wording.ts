import type { AuditEntry } from '../../../shared/projects';

function text(details: Record<string, unknown>, key: string): string {
  const value = details[key];
  return typeof value === 'string' || typeof value === 'number' ? String(value) : '?';
}

/** Links stopped by a membership change say so. */
const WHY_REVOKED: Record<string, string> = {
  creator_left: ' (the person who made it left the project)',
  creator_demoted: ' (the person who made it can no longer share)',
};

/** The report an entry is about, by its title. */
function report(entry: AuditEntry): string {
  return entry.names.report !== null ? `the report “${entry.names.report}”` : 'a report since deleted';
}

/** The member an entry is about, by name. */
function member(entry: AuditEntry): string {
  return entry.names.member ?? 'a former user';
}

/** A link shares one report or one series, named by its title. */
function linkTarget(entry: AuditEntry): string {
  if ('seriesId' in entry.details) return entry.names.series ? `the series “${entry.names.series}”` : 'a series since deleted';
  return report(entry);
}

/** One audit entry in plain words; unknown actions fall back to their code. */
export function describeAuditEntry(entry: AuditEntry): string {
  const d = entry.details;
  switch (entry.action) {
    case 'project.created': return `created the project "${text(d, 'name')}"`;
    case 'project.updated': return 'changed the project name or description';
    case 'project.deleted': return `deleted the project "${text(d, 'name')}"`;
    case 'invitation.sent': return `invited ${text(d, 'email')} as ${text(d, 'role')}`;
    case 'invitation.revoked': return 'withdrew an invitation';
    case 'member.joined': return `joined as ${text(d, 'role')}`;
    case 'member.role_changed': return `changed ${member(entry)} from ${text(d, 'from')} to ${text(d, 'to')}`;
    case 'member.removed': return `removed ${member(entry)} (${text(d, 'role')})`;
    case 'member.left': return 'left the project';
    case 'access_link.created': return `made an access link to ${linkTarget(entry)}`;
    case 'access_link.revoked': return `revoked an access link to ${linkTarget(entry)}${WHY_REVOKED[text(d, 'reason')] ?? ''}`;
    case 'series.created': return `made the series "${text(d, 'name')}"`;
    case 'series.deleted': return `deleted the series "${text(d, 'name')}"`;
    default: return entry.action;
  }
}
