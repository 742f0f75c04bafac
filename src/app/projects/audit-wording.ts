import type { AuditEntry } from '../../../shared/projects';

function text(details: Record<string, unknown>, key: string): string {
  const value = details[key];
  return typeof value === 'string' || typeof value === 'number' ? String(value) : '?';
}

/** A link shares one report or one series. */
function linkTarget(details: Record<string, unknown>): string {
  return 'seriesId' in details ? `series #${text(details, 'seriesId')}` : `report #${text(details, 'reportId')}`;
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
    case 'member.role_changed': return `changed member #${text(d, 'userId')} from ${text(d, 'from')} to ${text(d, 'to')}`;
    case 'member.removed': return `removed member #${text(d, 'userId')} (${text(d, 'role')})`;
    case 'member.left': return 'left the project';
    case 'access_link.created': return `made an access link to ${linkTarget(d)}`;
    case 'access_link.revoked': return `revoked an access link to ${linkTarget(d)}`;
    case 'series.created': return `made the series "${text(d, 'name')}"`;
    case 'series.deleted': return `deleted the series "${text(d, 'name')}"`;
    default: return entry.action;
  }
}
