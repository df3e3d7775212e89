/**
 * Report link tokens: 32 random bytes and an HMAC-SHA256 tag (keyed with the server's secret) over
 * them, base64url, joined by a dot. A forged or mistyped token is refused before any lookup; the
 * database keeps only the SHA-256 of the whole token.
 */
import { createHash, createHmac, randomBytes, timingSafeEqual } from 'node:crypto';
import type { Knex } from 'knex';

const TAG_BYTES = 16;

function tag(secret: string, random: string): string {
  return createHmac('sha256', secret).update(`report-link:${random}`).digest().subarray(0, TAG_BYTES).toString('base64url');
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

/**
 * The HTTP status the report page of a link should answer with: 200 for a working link, 410 for an
 * expired or withdrawn one, 404 for one that is forged or unknown (the page itself explains which).
 */
export async function reportLinkHttpStatus(
  db: Knex,
  secret: string,
  token: string,
): Promise<200 | 404 | 410> {
  if (!verifyReportToken(secret, token)) return 404;
  const link = await db('report_links')
    .where({ token_hash: hashReportToken(token) })
    .first<{ expires_at: Date; revoked_at: Date | null } | undefined>('expires_at', 'revoked_at');
  if (!link) return 404;
  return link.revoked_at || link.expires_at.getTime() <= Date.now() ? 410 : 200;
}
