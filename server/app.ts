import { existsSync } from 'node:fs';
import path from 'node:path';
import connectPgSimple from 'connect-pg-simple';
import express, { type Express, type Router } from 'express';
import session from 'express-session';
import type { Knex } from 'knex';
import pg from 'pg';
import { pinoHttp } from 'pino-http';
import type { Logger } from 'pino';
import type { Config } from './config';
import { GUARD, type Guard } from './http/authorize';
import { apiNotFound, errorHandler } from './http/error-handler';
import { csrfProtection, ownHostOnly, rateLimits, refuseDeclaredOversizeJson, securityHeaders } from './http/security';
import { textSafety } from './http/text-safety';
import type { Mailer } from './mail/mailer';
import { authRouter, SESSION_COOKIE } from './modules/auth/auth-router';
import { createPassport } from './modules/auth/auth-service';
import { devOutboxRouter } from './modules/dev/dev-outbox-router';
import { climateRouter } from './modules/climate/climate-router';
import { equipmentRouter } from './modules/equipment/equipment-router';
import { orgsRouter } from './modules/orgs/orgs-router';
import { projectsRouter } from './modules/projects/projects-router';
import { buildingRouter } from './modules/building/building-router';
import { scenariosRouter } from './modules/scenarios/scenarios-router';
import { logoRouter } from './modules/orgs/logo-router';
import { billingRouter } from './modules/billing/billing-router';
import { auditRouter } from './modules/audit/audit-router';
import { reportsRouter } from './modules/reports/reports-router';
import { publicReportsRouter } from './modules/reports/public-reports-router';
import { reportLinkHttpStatus, type ReportsDeps } from './modules/reports/reports-service';
import { createSweepPool } from './modules/scenarios/sweep-pool';
import { createPdfPool } from './modules/reports/pdf-pool';
import { createUploadPool } from './modules/climate/upload-pool';

export interface AppDeps {
  config: Config;
  db: Knex;
  mailer: Mailer;
  logger: Logger;
}

export interface RouteInfo {
  method: string;
  path: string;
  /** What guards the route: a role-checked action, any signed-in user, or nothing (public). */
  guard: Guard | null;
}

export interface App {
  app: Express;
  /** Every API route of the mounted routers, with its guard. */
  routes(): RouteInfo[];
  /** Weather files being read in the upload pool right now, and waiting their turn. */
  uploadsPending(): { running: number; waiting: number };
  /** Closes what the app opened itself (the session store's pool, the sweep, upload and PDF workers). */
  close(): Promise<void>;
}

const SESSION_DAYS = 14;
/** The largest JSON body the API reads. */
const JSON_BODY_LIMIT_BYTES = 1024 * 1024;

export function createApp({ config, db, mailer, logger }: AppDeps): App {
  const app = express();
  app.disable('x-powered-by');
  if (config.env === 'development') app.use(ownHostOnly(config));
  app.use(securityHeaders(config));
  if (config.env === 'production') app.set('trust proxy', 1);

  app.use(
    pinoHttp({
      logger,
      autoLogging: { ignore: (req) => !req.url.startsWith('/api') },
      serializers: {
        req: (req: { id: unknown; method: string; url: string }) => ({ id: req.id, method: req.method, url: req.url }),
        res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
      },
      customLogLevel: (_req, res, err) =>
        err || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : 'info',
    }),
  );

  app.get('/api/health', async (_req, res) => {
    try {
      await db.raw('select 1');
      res.json({ status: 'ok', database: 'up' });
    } catch {
      res.status(503).json({ status: 'degraded', database: 'down' });
    }
  });

  const sessionPool = new pg.Pool({ connectionString: config.databaseUrl, max: 5, connectionTimeoutMillis: 3000 });
  // An idle connection cut by a database restart must not crash the process.
  sessionPool.on('error', (err) => logger.warn({ err: err.message }, 'session pool connection lost'));
  const PgStore = connectPgSimple(session);
  app.use(
    '/api',
    session({
      name: SESSION_COOKIE,
      secret: config.sessionSecret,
      // No "touch" write on every request: a session lasts SESSION_DAYS from sign-in (and ends at sign-out).
      store: new PgStore({ pool: sessionPool, tableName: 'session', createTableIfMissing: false, disableTouch: true }),
      resave: false,
      saveUninitialized: false,
      cookie: {
        httpOnly: true,
        sameSite: 'lax',
        secure: config.env === 'production',
        maxAge: SESSION_DAYS * 86_400_000,
        path: '/',
      },
    }),
  );
  const auth = createPassport(db);
  app.use('/api', auth.initialize(), auth.session() as express.RequestHandler);

  // The provider's webhook reads its raw body (the signature covers the exact bytes): before the JSON parser.
  const billing = billingRouter(db, config);
  app.post('/api/v1/billing/webhook', ...billing.webhook);
  app.use(
    '/api/v1',
    refuseDeclaredOversizeJson(JSON_BODY_LIMIT_BYTES),
    express.json({ limit: JSON_BODY_LIMIT_BYTES, strict: true }),
  );
  app.use('/api/v1', textSafety);
  app.use('/api', csrfProtection(config));
  const limits = rateLimits(config, db);
  app.post('/api/v1/auth/sign-in', ...limits.signIn);
  app.post('/api/v1/auth/sign-up', ...limits.signUp);
  app.post('/api/v1/auth/password-resets', limits.passwordReset);
  app.post('/api/v1/invitations', limits.invitations);
  const sweepPool = createSweepPool({ databaseUrl: config.databaseUrl });
  const uploadPool = createUploadPool(config.uploadParses);
  const pdfPool = createPdfPool({ logger });
  // The API's routers, kept with their prefixes for `routes()` (the authorisation test walks them).
  const mounted: { prefix: string; router: Router }[] = [];
  const mount = (prefix: string, router: Router) => {
    mounted.push({ prefix, router });
    app.use(prefix, router);
  };
  mount('/api/v1', authRouter(db, config, mailer, auth));
  mount('/api/v1', orgsRouter(db, config, mailer));
  mount('/api/v1/projects', projectsRouter(db));
  mount('/api/v1/projects', buildingRouter(db));
  mount('/api/v1/projects', scenariosRouter(db, sweepPool, config.databaseUrl));
  mount('/api/v1', climateRouter(db, uploadPool));
  mount('/api/v1', equipmentRouter(db));
  const reports: ReportsDeps = { db, pool: sweepPool, pdfPool, config, mailer, sendLimits: limits.reportSends };
  mount('/api/v1', reportsRouter(reports));
  mount('/api/v1', publicReportsRouter(reports));
  mount('/api/v1', logoRouter(db));
  mount('/api/v1', billing.router);
  mount('/api/v1', auditRouter(db));
  if (config.devOutboxUrl) mount('/api/v1/dev', devOutboxRouter(db, config.devOutboxUrl, config.devOutboxToken));
  app.use('/api', apiNotFound);

  if (config.clientDist && existsSync(path.join(config.clientDist, 'index.html'))) {
    const dist = path.resolve(config.clientDist);
    app.use(express.static(dist, { index: false, maxAge: '1h' }));
    // A client report's page answers 410 for a withdrawn or expired link (the page explains it).
    app.get('/r/:token', async (req, res) => {
      const status = await reportLinkHttpStatus(db, config.sessionSecret, req.params.token);
      res.status(status).sendFile(path.join(dist, 'index.html'), { headers: { 'cache-control': 'no-store' } });
    });
    app.get('/{*splat}', (_req, res) => {
      res.sendFile(path.join(dist, 'index.html'), { headers: { 'cache-control': 'no-cache' } });
    });
  }

  app.use(errorHandler());
  return {
    app,
    routes: () => routeTable(mounted),
    uploadsPending: () => uploadPool.pending(),
    close: async () => {
      await Promise.all([sessionPool.end(), sweepPool.close(), uploadPool.close(), pdfPool.close()]);
    },
  };
}

interface RouteLayer {
  route?: { path: string; methods: Record<string, boolean>; stack: { handle: { [GUARD]?: Guard } }[] };
}

function routeTable(mounted: readonly { prefix: string; router: Router }[]): RouteInfo[] {
  const out: RouteInfo[] = [];
  for (const { prefix, router } of mounted) {
    for (const layer of (router as unknown as { stack: RouteLayer[] }).stack) {
      const route = layer.route;
      if (!route) continue;
      const guard = route.stack.map((l) => l.handle[GUARD]).find((g) => g !== undefined) ?? null;
      for (const [method, on] of Object.entries(route.methods)) {
        if (on && method !== '_all') out.push({ method: method.toUpperCase(), path: prefix + route.path, guard });
      }
    }
  }
  return out;
}
