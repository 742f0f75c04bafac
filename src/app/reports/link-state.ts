import type { AccessLinkView } from '../../../shared/sharing';

export type LinkState = 'active' | 'expired' | 'revoked';

export function linkState(link: AccessLinkView, now = Date.now()): LinkState {
  if (link.revokedAt) return 'revoked';
  return new Date(link.expiresAt).getTime() <= now ? 'expired' : 'active';
}
