/**
 * Rate-limit counters in PostgreSQL (`rate_limit_hits`), so that every server process on one
 * database counts the same hits: a store for express-rate-limit, and `consume` for limits checked
 * inside a route (where the key is only known after the request is authorised).
 */
import type { ClientRateLimitInfo, Options, Store } from 'express-rate-limit';
import type { Knex } from 'knex';
import { HttpError } from './http-error';

/** Expired counters are removed now and then by an increment (about one in this many). */
const PRUNE_EVERY = 200;

export class PgRateLimitStore implements Store {
  /** The counters live in the database: another process's hits count here too. */
  readonly localKeys = false;
  readonly prefix: string;
  private windowMs = 60_000;

  constructor(
    private readonly db: Knex,
    name: string,
  ) {
    this.prefix = `${name}|`;
  }

  init(options: Options): void {
    this.windowMs = options.windowMs;
  }

  /** Sets the window of a store used without the middleware (`consume`). */
  withWindow(windowMs: number): this {
    this.windowMs = windowMs;
    return this;
  }

  async get(key: string): Promise<ClientRateLimitInfo | undefined> {
    const row = await this.db('rate_limit_hits')
      .where({ key: this.prefix + key })
      .andWhere('reset_at', '>', this.db.fn.now())
      .first<{ hits: number; reset_at: Date } | undefined>('hits', 'reset_at');
    return row && { totalHits: row.hits, resetTime: row.reset_at };
  }

  async increment(key: string): Promise<ClientRateLimitInfo> {
    // One statement: a new counter, or the next hit of a running window, or a fresh window after an expired one.
    const result = await this.db.raw<{ rows: { hits: number; reset_at: Date }[] }>(
      `insert into rate_limit_hits as r (key, hits, reset_at)
       values (?, 1, now() + ? * interval '1 millisecond')
       on conflict (key) do update set
         hits = case when r.reset_at <= now() then 1 else r.hits + 1 end,
         reset_at = case when r.reset_at <= now() then excluded.reset_at else r.reset_at end
       returning hits, reset_at`,
      [this.prefix + key, this.windowMs],
    );
    const row = result.rows[0];
    if (Math.random() * PRUNE_EVERY < 1)
      await this.db('rate_limit_hits').where('reset_at', '<', this.db.fn.now()).delete();
    return { totalHits: row?.hits ?? 1, resetTime: row?.reset_at ?? new Date(Date.now() + this.windowMs) };
  }

  async decrement(key: string): Promise<void> {
    await this.db('rate_limit_hits')
      .where({ key: this.prefix + key })
      .andWhere('reset_at', '>', this.db.fn.now())
      .update({ hits: this.db.raw('greatest(hits - 1, 0)') });
  }

  async resetKey(key: string): Promise<void> {
    await this.db('rate_limit_hits')
      .where({ key: this.prefix + key })
      .delete();
  }
}

/** 429 with the time to wait: the error handler sends it as `Retry-After` (seconds) as well. */
export class RateLimitedError extends HttpError {
  constructor(
    readonly retryAfterSeconds: number,
    what: string,
  ) {
    super(429, 'rate_limited', `Too many ${what}; try again in ${waitInWords(retryAfterSeconds)}`);
    this.name = 'RateLimitedError';
  }
}

/** Seconds until `resetTime` (at least 1). */
export function secondsUntil(resetTime: Date | undefined, fallbackMs: number): number {
  const ms = resetTime ? resetTime.getTime() - Date.now() : fallbackMs;
  return Math.max(1, Math.ceil(ms / 1000));
}

export function waitInWords(seconds: number): string {
  if (seconds < 90) return `${seconds} second${seconds === 1 ? '' : 's'}`;
  const minutes = Math.ceil(seconds / 60);
  if (minutes < 90) return `${minutes} minutes`;
  return `${Math.ceil(minutes / 60)} hours`;
}

export interface Limit {
  store: PgRateLimitStore;
  limit: number;
  windowMs: number;
  /** What is counted, in words for the 429's message ("report e-mails from this organisation"). */
  what: string;
}

/** Counts one hit of `key` against `limit`; throws RateLimitedError once past it. */
export async function consume(limit: Limit, key: string): Promise<void> {
  const { totalHits, resetTime } = await limit.store.increment(key);
  if (totalHits > limit.limit) throw new RateLimitedError(secondsUntil(resetTime, limit.windowMs), limit.what);
}
