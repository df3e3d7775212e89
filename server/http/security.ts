/**
 * Security headers (helmet, with a content-security policy the built client passes), the CSRF
 * check of state-changing API requests, and rate limits on the endpoints that guess-and-try attacks
 * use (express-rate-limit, counted in PostgreSQL), all answering in the API's error shape.
 */
import type { RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit, type Options } from 'express-rate-limit';
import helmet from 'helmet';
import type { Knex } from 'knex';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '@shared/api/csrf';
import type { Config } from '../config';
import { SESSION_COOKIE } from '../modules/auth/auth-router';
import { HttpError } from './http-error';
import { PgRateLimitStore, RateLimitedError, secondsUntil, type Limit } from './rate-limit-store';

export function securityHeaders(config: Config): RequestHandler {
  return helmet({
    contentSecurityPolicy: {
      useDefaults: false,
      directives: {
        defaultSrc: ["'self'"],
        scriptSrc: ["'self'"],
        // Angular Material and the charts set element styles at run time.
        styleSrc: ["'self'", "'unsafe-inline'"],
        imgSrc: ["'self'", 'data:', 'blob:'],
        fontSrc: ["'self'"],
        connectSrc: ["'self'"],
        workerSrc: ["'self'", 'blob:'],
        objectSrc: ["'none'"],
        baseUri: ["'self'"],
        formAction: ["'self'"],
        frameAncestors: ["'none'"],
      },
    },
    crossOriginEmbedderPolicy: false,
    strictTransportSecurity: config.env === 'production',
    referrerPolicy: { policy: 'same-origin' },
  });
}

/**
 * Development only: the server answers only to its own names (loopback, HOST, PUBLIC_URL's host),
 * so that a page whose DNS name is later pointed at 127.0.0.1 (DNS rebinding) gets nothing from it.
 * Any port: `ng serve`'s proxy passes its own (localhost:4200).
 */
export function ownHostOnly(config: Config): RequestHandler {
  const own = new Set([
    'localhost',
    '127.0.0.1',
    '[::1]',
    hostName(config.host),
    new URL(config.publicUrl).hostname.toLowerCase(),
  ]);
  return (req, res, next) => {
    const host = req.headers.host ?? '';
    if (own.has(hostName(host))) return next();
    res.status(421).json({
      error: {
        code: 'unknown_host',
        message: 'This development server answers only to its own address (127.0.0.1 or localhost)',
      },
    });
  };
}

/** The lower-cased name of a `host[:port]` (IPv6 in brackets). */
function hostName(hostAndPort: string): string {
  const h = hostAndPort.trim().toLowerCase();
  if (h.startsWith('[')) return h.slice(0, h.indexOf(']') + 1);
  if (h.split(':').length > 2) return `[${h}]`; // a bare IPv6 address
  return h.split(':')[0] ?? '';
}

const SAFE = new Set(['GET', 'HEAD', 'OPTIONS']);

/**
 * State-changing requests that carry the session cookie must carry the CSRF header; any request
 * whose Origin is another site is refused. The provider's webhook (no cookie, signed body) is exempt.
 */
export function csrfProtection(config: Config): RequestHandler {
  const ownOrigin = new URL(config.publicUrl).origin;
  const header = CSRF_HEADER.toLowerCase();
  return (req, _res, next) => {
    if (SAFE.has(req.method) || req.path === '/v1/billing/webhook') return next();
    const origin = req.headers.origin;
    const host = req.headers.host;
    if (origin && origin !== 'null' && origin !== ownOrigin && !(host && URL.parse(origin)?.host === host)) {
      return next(new HttpError(403, 'csrf', 'This request came from another site and was refused'));
    }
    const hasSession = (req.headers.cookie ?? '').split(/;\s*/).some((c) => c.startsWith(`${SESSION_COOKIE}=`));
    if (hasSession && req.headers[header] !== CSRF_HEADER_VALUE) {
      return next(
        new HttpError(
          403,
          'csrf',
          'This request lacks the header Tailroom’s pages send; reload the page and try again',
        ),
      );
    }
    next();
  };
}

/**
 * A JSON body declared (Content-Length) larger than `limitBytes` is refused at once with 413, before
 * any of it is read; the connection is closed rather than drained. (The JSON parser would read the
 * whole declared body first.)
 */
export function refuseDeclaredOversizeJson(limitBytes: number): RequestHandler {
  return (req, res, next) => {
    const declared = Number(req.headers['content-length'] ?? 0);
    if (!(declared > limitBytes) || !req.is('json')) return next();
    res.set('Connection', 'close');
    next(
      new HttpError(
        413,
        'payload_too_large',
        `The request body is too large (at most ${Math.floor(limitBytes / 1024)} kB)`,
      ),
    );
  };
}

function limiter(db: Knex, name: string, { what, ...options }: Partial<Options> & { what: string }): RequestHandler {
  return rateLimit({
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    store: new PgRateLimitStore(db, name),
    ...options,
    handler: (req, _res, next, used) => {
      // express-rate-limit has set Retry-After already; the message says the same in words.
      const info = (req as { rateLimit?: { resetTime?: Date } }).rateLimit;
      next(new RateLimitedError(secondsUntil(info?.resetTime, used.windowMs), what));
    },
  });
}

const emailKey = (body: unknown) =>
  typeof body === 'object' && body !== null && typeof (body as { email?: unknown }).email === 'string'
    ? (body as { email: string }).email.trim().toLowerCase()
    : '';

/**
 * Rate limits, counted in PostgreSQL so that every server process on the database shares them
 * (a database round trip only on the routes they guard).
 */
export function rateLimits(config: Config, db: Knex) {
  return {
    /**
     * Failed sign-ins: 10 per 15 minutes per address and e-mail, and SIGN_IN_FAILURES_PER_ADDRESS (15)
     * per 15 minutes per network address whatever the e-mail (one password tried on many accounts).
     */
    signIn: [
      limiter(db, 'sign-in', {
        what: 'failed sign-ins',
        windowMs: 15 * 60_000,
        limit: 10,
        skipSuccessfulRequests: true,
        keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${emailKey(req.body)}`,
      }),
      limiter(db, 'sign-in-address', {
        what: 'failed sign-ins from this network address',
        windowMs: 15 * 60_000,
        limit: config.limits.signInFailuresPerAddress,
        skipSuccessfulRequests: true,
        keyGenerator: (req) => ipKeyGenerator(req.ip ?? ''),
      }),
    ],
    /** Password-reset requests: 5 per hour per address and e-mail. */
    passwordReset: limiter(db, 'password-reset', {
      what: 'password-reset requests',
      windowMs: 60 * 60_000,
      limit: 5,
      keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${emailKey(req.body)}`,
    }),
    /** Sign-ups (each sends an e-mail): SIGN_UP_PER_HOUR (20) per hour per network address, and 5 per hour to one e-mail address from anywhere. */
    signUp: [
      limiter(db, 'sign-up', {
        what: 'sign-up requests',
        windowMs: 60 * 60_000,
        limit: config.signUpPerHour,
        keyGenerator: (req) => ipKeyGenerator(req.ip ?? ''),
      }),
      limiter(db, 'sign-up-email', {
        what: 'sign-up requests for this e-mail address',
        windowMs: 60 * 60_000,
        limit: 5,
        keyGenerator: (req) => `email|${emailKey(req.body)}`,
      }),
    ],
    /** Invitations: 30 per hour per address. */
    invitations: limiter(db, 'invitations', {
      what: 'invitations',
      windowMs: 60 * 60_000,
      limit: 30,
      keyGenerator: (req) => ipKeyGenerator(req.ip ?? ''),
    }),
    /** Report e-mails (checked in the route, once the organisation is known): per organisation per hour, per recipient per day. */
    reportSends: reportSendLimits(config, db),
  };
}

export interface ReportSendLimits {
  perOrganization: Limit;
  perRecipient: Limit;
}

function reportSendLimits(config: Config, db: Knex): ReportSendLimits {
  const hour = 60 * 60_000;
  return {
    perOrganization: {
      store: new PgRateLimitStore(db, 'report-send-org').withWindow(hour),
      limit: config.limits.reportSendsPerOrganizationPerHour,
      windowMs: hour,
      what: 'report e-mails from this organisation this hour',
    },
    perRecipient: {
      store: new PgRateLimitStore(db, 'report-send-to').withWindow(24 * hour),
      limit: config.limits.reportSendsPerRecipientPerDay,
      windowMs: 24 * hour,
      what: 'report e-mails to this address today',
    },
  };
}
