/** Shapes of the access-link and comment endpoints' answers. */
export interface AccessLinkView {
  id: number;
  reportId: number;
  createdBy: string;
  createdAt: string;
  expiresAt: string;
  revokedAt: string | null;
  lastUsedAt: string | null;
}

/** A link just made: the only time its token and address are ever shown. */
export interface NewAccessLink {
  id: number;
  reportId: number;
  token: string;
  url: string;
  expiresAt: string;
}

export interface ReportComment {
  id: number;
  body: string;
  author: { id: number; displayName: string };
  createdAt: string;
}

export type LinkState = 'active' | 'expired' | 'revoked';

export function linkState(link: AccessLinkView, now = Date.now()): LinkState {
  if (link.revokedAt) return 'revoked';
  return new Date(link.expiresAt).getTime() <= now ? 'expired' : 'active';
}
