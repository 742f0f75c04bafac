import { describe, expect, it } from 'vitest';
import { describeAuditEntry } from './audit-wording';
import type { AuditEntry } from '../../../shared/projects';

const entry = (action: string, details: Record<string, unknown>): AuditEntry => ({ id: 1, action, details, actor: null, createdAt: '' });

describe('describeAuditEntry', () => {
  it('when an invitation or role change is logged, then the words name the address, the roles and the member', () => {
    expect(describeAuditEntry(entry('invitation.sent', { email: 'a@b.example', role: 'editor' }))).toBe('invited a@b.example as editor');
    expect(describeAuditEntry(entry('member.role_changed', { userId: 7, from: 'viewer', to: 'owner' }))).toBe('changed member #7 from viewer to owner');
  });

  it('when a series or a link to one is logged, then the words name the series', () => {
    expect(describeAuditEntry(entry('series.created', { seriesId: 3, name: 'Argon heating' }))).toBe('made the series "Argon heating"');
    expect(describeAuditEntry(entry('access_link.created', { seriesId: 3 }))).toBe('made an access link to series #3');
    expect(describeAuditEntry(entry('access_link.revoked', { reportId: 9 }))).toBe('revoked an access link to report #9');
  });

  it('when the action is unknown or a detail is missing, then the code or a question mark shows instead of nothing', () => {
    expect(describeAuditEntry(entry('series.renamed', {}))).toBe('series.renamed');
    expect(describeAuditEntry(entry('member.joined', {}))).toBe('joined as ?');
  });
});
