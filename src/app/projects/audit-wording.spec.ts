import { describe, expect, it } from 'vitest';
import { describeAuditEntry } from './audit-wording';
import type { AuditEntry } from '../../../shared/projects';

const entry = (action: string, details: Record<string, unknown>, names: AuditEntry['names'] = { report: null, series: null, member: null }): AuditEntry =>
  ({ id: 1, action, details, actor: null, names, createdAt: '' });

describe('describeAuditEntry', () => {
  it('when an invitation or role change is logged, then the words name the address, the roles and the member', () => {
    expect(describeAuditEntry(entry('invitation.sent', { email: 'a@b.example', role: 'editor' }))).toBe('invited a@b.example as editor');
    expect(describeAuditEntry(entry('member.role_changed', { userId: 7, from: 'viewer', to: 'owner' }, { report: null, series: null, member: 'Ines Moreau' })))
      .toBe('changed Ines Moreau from viewer to owner');
  });

  it('when an access link is logged, then the report is named by its title, never by its number', () => {
    const title = 'Argon at 86 K · MSD, VACF';
    expect(describeAuditEntry(entry('access_link.created', { reportId: 9 }, { report: title, series: null, member: null }))).toBe(`made an access link to the report “${title}”`);
    expect(describeAuditEntry(entry('access_link.revoked', { reportId: 9, reason: 'creator_left' }, { report: title, series: null, member: null })))
      .toBe(`revoked an access link to the report “${title}” (the person who made it left the project)`);
    expect(describeAuditEntry(entry('access_link.revoked', { reportId: 9 }))).toBe('revoked an access link to a report since deleted');
    expect(describeAuditEntry(entry('member.removed', { userId: 4, role: 'viewer' }))).toBe('removed a former user (viewer)');
    expect(describeAuditEntry(entry('access_link.created', { seriesId: 3 }, { report: null, series: 'Argon melting 40–130 K', member: null })))
      .toBe('made an access link to the series “Argon melting 40–130 K”');
  });

  it('when a series or a link to one is logged, then the words name the series', () => {
    expect(describeAuditEntry(entry('series.created', { seriesId: 3, name: 'Argon heating' }))).toBe('made the series "Argon heating"');
    expect(describeAuditEntry(entry('access_link.created', { seriesId: 3 }, { report: null, series: 'Argon heating', member: null }))).toBe('made an access link to the series “Argon heating”');
    expect(describeAuditEntry(entry('access_link.created', { seriesId: 3 }))).toBe('made an access link to a series since deleted');
  });

  it('when the action is unknown or a detail is missing, then the code or a question mark shows instead of nothing', () => {
    expect(describeAuditEntry(entry('series.renamed', {}))).toBe('series.renamed');
    expect(describeAuditEntry(entry('member.joined', {}))).toBe('joined as ?');
  });
});
