import { createHash, randomBytes } from 'node:crypto';

/** A new unguessable link token (32 random bytes, base64url) and the hash that is stored instead of it. */
export function newLinkToken(): { token: string; hash: string } {
  const token = randomBytes(32).toString('base64url');
  return { token, hash: hashLinkToken(token) };
}

export function hashLinkToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}
