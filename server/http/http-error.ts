import type { FieldIssue } from '@shared/api/api-error';

/** An error whose status, code and message are safe to show to the caller. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: FieldIssue[],
  ) {
    super(message);
    this.name = 'HttpError';
  }
}

export const notFound = (what = 'That item') => new HttpError(404, 'not_found', `${what} was not found`);
