/**
 * Report link tokens: 32 random bytes and an HMAC-SHA256 tag (keyed with the server's secret) over
 * them, base64url, joined by a dot. A forged or mistyped token is refused before any lookup; the
 * database keeps only the SHA-256 of the whole token.
 */
import { createHash, createHmac, randomBytes, timingSafeEqual } from 'node:crypto';

const TAG_BYTES = 16;

function tag(secret: string, random: string): string {
  return createHmac('sha256', secret)
    .update(`report-link:${random}`)
    .digest()
    .subarray(0, TAG_BYTES)
    .toString('base64url');
}

export function newReportToken(secret: string): { token: string; hash: string } {
  const random = randomBytes(32).toString('base64url');
  const token = `${random}.${tag(secret, random)}`;
  return { token, hash: hashReportToken(token) };
}

/** Whether the token carries a valid tag (false for anything malformed). */
export function verifyReportToken(secret: string, token: string): boolean {
  const m = /^([A-Za-z0-9_-]{43})\.([A-Za-z0-9_-]{22})$/.exec(token);
  if (!m?.[1] || !m[2]) return false;
  const expected = Buffer.from(tag(secret, m[1]));
  const given = Buffer.from(m[2]);
  return expected.length === given.length && timingSafeEqual(expected, given);
}

export function hashReportToken(token: string): string {
  return createHash('sha256').update(token).digest('hex');
}
