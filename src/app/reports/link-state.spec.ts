import { describe, expect, it } from 'vitest';
import type { AccessLinkView } from '../../../shared/sharing';
import { linkState, revocationWords } from './link-state';

const link = (changes: Partial<AccessLinkView>): AccessLinkView => ({
  id: 1, reportId: 1, createdBy: 'A', createdAt: '2026-01-01T00:00:00Z', expiresAt: '2026-01-08T00:00:00Z', revokedAt: null, revokedReason: null, lastUsedAt: null, ...changes,
});

describe('access link state', () => {
  const now = Date.parse('2026-01-05T00:00:00Z');
  it('when a link is neither revoked nor past its expiry, then it is active', () => {
    expect(linkState(link({}), now)).toBe('active');
  });
  it('when its expiry has passed, then it is expired; when revoked, revoked wins', () => {
    expect(linkState(link({ expiresAt: '2026-01-04T00:00:00Z' }), now)).toBe('expired');
    expect(linkState(link({ expiresAt: '2026-01-04T00:00:00Z', revokedAt: '2026-01-02T00:00:00Z' }), now)).toBe('revoked');
  });
});

describe('why a link was revoked', () => {
  it('when its creator left or became a viewer, then the words say so; when a member revoked it, then just "revoked"', () => {
    expect(revocationWords(link({ revokedAt: '2026-01-02T00:00:00Z', revokedReason: 'creator_left' }))).toBe('revoked when its creator left the project');
    expect(revocationWords(link({ revokedAt: '2026-01-02T00:00:00Z', revokedReason: 'creator_demoted' }))).toBe('revoked when its creator became a viewer');
    expect(revocationWords(link({ revokedAt: '2026-01-02T00:00:00Z', revokedReason: 'revoked' }))).toBe('revoked');
  });
});
