/**
 * Response bodies read through the zod schemas the client and the server share: a body that does
 * not match its schema fails the test with zod's issues, the status and the body itself.
 */
import assert from 'node:assert/strict';
import { z } from 'zod';
import { apiErrorSchema, type ApiError } from '../../shared/api/api-error';

/** What a supertest response (or a fetch answer read as JSON) gives. */
export interface AnswerLike {
  status: number;
  body: unknown;
}

/** The body parsed with `schema` (defaults applied, unknown keys dropped as the client drops them). */
export function parseBody<S extends z.ZodType>(schema: S, res: AnswerLike): z.output<S> {
  const parsed = schema.safeParse(res.body);
  if (parsed.success) return parsed.data;
  const body = JSON.stringify(res.body) ?? String(res.body);
  assert.fail(
    `The ${res.status} answer does not match its schema:\n${z.prettifyError(parsed.error)}\n` +
      `Body: ${body.length > 2000 ? `${body.slice(0, 2000)}…` : body}`,
  );
}

/** The `error` of a refusal, parsed with the one error shape every non-2xx answer uses. */
export function parseError(res: AnswerLike): ApiError['error'] {
  assert.ok(res.status >= 400, `expected a refusal, got ${res.status}`);
  return parseBody(apiErrorSchema, res).error;
}

/** The bytes of a binary answer (a PDF, an image), which supertest reads into a Buffer. */
export function bodyBytes(res: AnswerLike): Buffer {
  assert.ok(Buffer.isBuffer(res.body), `expected the ${res.status} answer to be bytes, got ${typeof res.body}`);
  return res.body;
}
