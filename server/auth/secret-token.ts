import { createHash, randomBytes } from 'node:crypto';

/** sha256 in hex: the only form in which tokens (API, reset, invitation, link) are stored. */
export function sha256Hex(value: string): string {
  return createHash('sha256').update(value, 'utf8').digest('hex');
}

export interface SecretToken {
  /** Shown to its holder once; never stored. */
  token: string;
  hash: string;
}

/** 32 random bytes in base64url, optionally with a prefix that says what the token is for. */
export function newSecretToken(prefix = ''): SecretToken {
  const token = prefix + randomBytes(32).toString('base64url');
  return { token, hash: sha256Hex(token) };
}
