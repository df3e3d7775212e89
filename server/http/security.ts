/**
 * Security headers (helmet, with a content-security policy the built client passes), the CSRF
 * check of state-changing API requests, and rate limits on the endpoints that guess-and-try attacks
 * use (express-rate-limit), all answering in the API's error shape.
 */
import type { RequestHandler } from 'express';
import { ipKeyGenerator, rateLimit, type Options } from 'express-rate-limit';
import helmet from 'helmet';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '@shared/api/csrf';
import type { Config } from '../config';
import { SESSION_COOKIE } from '../modules/auth/auth-router';
import { HttpError } from './http-error';

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
      return next(new HttpError(403, 'csrf', 'This request lacks the header Tailroom’s pages send; reload the page and try again'));
    }
    next();
  };
}

function limiter({ what, ...options }: Partial<Options> & { what: string }): RequestHandler {
  return rateLimit({
    standardHeaders: 'draft-8',
    legacyHeaders: false,
    ...options,
    handler: (_req, _res, next, used) => {
      const minutes = Math.ceil(used.windowMs / 60_000);
      next(new HttpError(429, 'rate_limited', `Too many ${what}; wait up to ${minutes} minutes and try again`));
    },
  });
}

const emailKey = (body: unknown) =>
  typeof body === 'object' && body !== null && typeof (body as { email?: unknown }).email === 'string'
    ? (body as { email: string }).email.trim().toLowerCase()
    : '';

/** Rate limits (in memory: one server process). */
export function rateLimits(config: Config) {
  return {
    /** Failed sign-ins: 10 per 15 minutes per address and e-mail. */
    signIn: limiter({
      what: 'failed sign-ins',
      windowMs: 15 * 60_000,
      limit: 10,
      skipSuccessfulRequests: true,
      keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${emailKey(req.body)}`,
    }),
    /** Password-reset requests: 5 per hour per address and e-mail. */
    passwordReset: limiter({
      what: 'password-reset requests',
      windowMs: 60 * 60_000,
      limit: 5,
      keyGenerator: (req) => `${ipKeyGenerator(req.ip ?? '')}|${emailKey(req.body)}`,
    }),
    /** Sign-ups (each sends an e-mail): SIGN_UP_PER_HOUR (20) per hour per network address, and 5 per hour to one e-mail address from anywhere. */
    signUp: [
      limiter({ what: 'sign-up requests', windowMs: 60 * 60_000, limit: config.signUpPerHour, keyGenerator: (req) => ipKeyGenerator(req.ip ?? '') }),
      limiter({ what: 'sign-up requests for this e-mail address', windowMs: 60 * 60_000, limit: 5, keyGenerator: (req) => `email|${emailKey(req.body)}` }),
    ],
    /** Invitations: 30 per hour per address. */
    invitations: limiter({ what: 'invitations', windowMs: 60 * 60_000, limit: 30, keyGenerator: (req) => ipKeyGenerator(req.ip ?? '') }),
  };
}
