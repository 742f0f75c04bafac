import type { AccessLinkView } from '../../../shared/sharing';

/** A link of a report or a series as the links list shows it. */
export type LinkRow = Omit<AccessLinkView, 'reportId'>;

export type LinkState = 'active' | 'expired' | 'revoked';

export function linkState(link: LinkRow, now = Date.now()): LinkState {
  if (link.revokedAt) return 'revoked';
  return new Date(link.expiresAt).getTime() <= now ? 'expired' : 'active';
}

/** Plain words for why a link was revoked, beside its date. */
export function revocationWords(link: LinkRow): string {
  if (link.revokedReason === 'creator_left') return 'revoked when its creator left the project';
  if (link.revokedReason === 'creator_demoted') return 'revoked when its creator became a viewer';
  return 'revoked';
}
