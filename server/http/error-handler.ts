import type { ErrorRequestHandler, RequestHandler } from 'express';
import { MulterError } from 'multer';
import { ZodError } from 'zod';
import type { FieldIssue } from '@shared/api/api-error';
import { HttpError } from './http-error';
import { RateLimitedError } from './rate-limit-store';

/** zod issues → one field-level detail each, with dotted paths ('' for the whole body). */
export function zodDetails(err: ZodError): FieldIssue[] {
  const out: FieldIssue[] = [];
  for (const issue of err.issues) {
    const base = issue.path.map(String).join('.');
    if (issue.code === 'unrecognized_keys') {
      for (const key of issue.keys) {
        out.push({ path: base ? `${base}.${key}` : key, message: 'Unknown field' });
      }
    } else {
      out.push({ path: base, message: issue.message });
    }
  }
  return out;
}

interface BodyParserError {
  type?: string;
  status?: number;
  expose?: boolean;
}

const DATABASE_DOWN_CODES = new Set([
  'ECONNREFUSED',
  'ECONNRESET',
  'EPIPE',
  '57P01',
  '57P02',
  '57P03',
  '08000',
  '08001',
  '08003',
  '08006',
]);

/** Whether an error means PostgreSQL cannot be reached (stopped, restarting, connections cut or exhausted). */
export function isDatabaseUnavailable(err: unknown): boolean {
  if (!(err instanceof Error)) return false;
  const code = (err as { code?: unknown }).code;
  if (typeof code === 'string' && DATABASE_DOWN_CODES.has(code)) return true;
  if (err.name === 'KnexTimeoutError') return true;
  return /Connection terminated|connect ECONNREFUSED|the database system is (starting up|shutting down)|terminating connection due to administrator command|timeout exceeded when trying to connect/i.test(
    err.message,
  );
}

/**
 * An error the multipart parser raised while reading the request (a part header with control
 * characters, a missing boundary, a cut-off form): the uploader's mistake, not ours. Multer marks
 * the errors it passes on from the parser with `storageErrors`.
 */
function isMalformedUpload(err: unknown): err is Error {
  return err instanceof Error && Array.isArray((err as { storageErrors?: unknown }).storageErrors);
}

// Keep all four parameters: that is how Express recognises an error handler.
export function errorHandler(): ErrorRequestHandler {
  return (err: unknown, req, res, _next) => {
    if (res.headersSent) {
      req.log.error({ err }, 'error after headers were sent');
      res.end();
      return;
    }
    if (err instanceof ZodError) {
      res.status(400).json({
        error: { code: 'invalid_input', message: 'Some fields are not valid', details: zodDetails(err) },
      });
      return;
    }
    if (err instanceof HttpError) {
      if (err instanceof RateLimitedError) res.set('Retry-After', String(err.retryAfterSeconds));
      res.status(err.status).json({
        error: { code: err.code, message: err.message, ...(err.details ? { details: err.details } : {}) },
      });
      return;
    }
    if (err instanceof MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') {
        res
          .status(413)
          .json({ error: { code: 'file_too_large', message: 'The file is larger than the upload limit' } });
      } else {
        res.status(400).json({
          error: {
            code: 'invalid_upload',
            message: 'The upload could not be read',
            details: [{ path: err.field ?? '', message: err.message }],
          },
        });
      }
      return;
    }
    if (isMalformedUpload(err)) {
      res.status(400).json({
        error: {
          code: 'invalid_upload',
          message:
            'The upload could not be read; a file name or part header holds characters an upload cannot carry. Rename the file and try again.',
          details: [{ path: '', message: err.message }],
        },
      });
      return;
    }
    const bp = err as BodyParserError;
    if (bp.type === 'entity.parse.failed') {
      res.status(400).json({ error: { code: 'malformed_json', message: 'The request body is not valid JSON' } });
      return;
    }
    if (bp.type === 'entity.too.large') {
      res.status(413).json({ error: { code: 'payload_too_large', message: 'The request body is too large' } });
      return;
    }
    if (bp.expose && bp.status && bp.status >= 400 && bp.status < 500) {
      res.status(bp.status).json({ error: { code: 'bad_request', message: 'The request could not be read' } });
      return;
    }
    if (isDatabaseUnavailable(err)) {
      req.log.warn({ err: (err as Error).message, path: req.path }, 'database unavailable');
      res
        .status(503)
        .set('Retry-After', '5')
        .json({
          error: {
            code: 'database_unavailable',
            message: 'The database is not reachable at the moment; nothing was changed. Try again in a few seconds.',
          },
        });
      return;
    }
    req.log.error({ err, path: req.path }, 'unhandled error');
    res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on our side' } });
  };
}

/** Unknown /api paths answer 404 in the error shape rather than falling through to the client. */
export const apiNotFound: RequestHandler = (req, res) => {
  res.status(404).json({ error: { code: 'not_found', message: `No such endpoint: ${req.method} ${req.path}` } });
};
