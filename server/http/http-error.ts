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

/** 409 for an optimistic-concurrency miss: someone saved since the caller loaded `what`. */
export const staleUpdate = (byName: string, what: string) =>
  new HttpError(
    409,
    'stale_update',
    `${byName} changed this ${what} since you opened it; reload to see their changes, then apply yours again`,
  );

export const notFound = (what = 'That item') => new HttpError(404, 'not_found', `${what} was not found`);
