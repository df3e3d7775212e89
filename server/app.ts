import { existsSync } from 'node:fs';
import path from 'node:path';
import connectPgSimple from 'connect-pg-simple';
import express, { type Express } from 'express';
import session from 'express-session';
import type { Knex } from 'knex';
import passport from 'passport';
import pg from 'pg';
import { pinoHttp } from 'pino-http';
import type { Logger } from 'pino';
import type { Config } from './config';
import { apiNotFound, errorHandler } from './http/error-handler';
import type { Mailer } from './mail/mailer';
import { authRouter, configurePassport, SESSION_COOKIE } from './modules/auth/auth-router';
import { devOutboxRouter } from './modules/dev/dev-outbox-router';
import { climateRouter } from './modules/climate/climate-router';
import { equipmentRouter } from './modules/equipment/equipment-router';
import { orgsRouter } from './modules/orgs/orgs-router';
import { projectsRouter } from './modules/projects/projects-router';
import { scenariosRouter } from './modules/scenarios/scenarios-router';
import { logoRouter } from './modules/reports/logo-router';
import { billingRouter } from './modules/billing/billing-router';
import { reportsRouter } from './modules/reports/reports-router';
import { reportLinkHttpStatus } from './modules/reports/report-tokens';
import { createSweepPool } from './modules/scenarios/sweep-pool';

export interface AppDeps {
  config: Config;
  db: Knex;
  mailer: Mailer;
  logger: Logger;
}

export interface App {
  app: Express;
  /** Closes what the app opened itself (the session store's pool, the sweep workers). */
  close(): Promise<void>;
}

const SESSION_DAYS = 14;

export function createApp({ config, db, mailer, logger }: AppDeps): App {
  const app = express();
  app.disable('x-powered-by');
  if (config.env === 'production') app.set('trust proxy', 1);

  app.use(
    pinoHttp({
      logger,
      autoLogging: { ignore: (req) => !req.url.startsWith('/api') },
      serializers: {
        req: (req: { id: unknown; method: string; url: string }) => ({ id: req.id, method: req.method, url: req.url }),
        res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
      },
      customLogLevel: (_req, res, err) => (err || res.statusCode >= 500 ? 'error' : res.statusCode >= 400 ? 'warn' : 'info'),
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

  const sessionPool = new pg.Pool({ connectionString: config.databaseUrl, max: 5 });
  const PgStore = connectPgSimple(session);
  app.use(
    '/api',
    session({
      name: SESSION_COOKIE,
      secret: config.sessionSecret,
      store: new PgStore({ pool: sessionPool, tableName: 'session', createTableIfMissing: false }),
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
  configurePassport(db);
  app.use('/api', passport.initialize(), passport.session() as express.RequestHandler);

  // The provider's webhook reads its raw body (the signature covers the exact bytes): before the JSON parser.
  const billing = billingRouter(db, config);
  app.post('/api/v1/billing/webhook', ...billing.webhook);
  app.use('/api/v1', express.json({ limit: '1mb', strict: true }));
  app.use('/api/v1', authRouter(db, config, mailer));
  app.use('/api/v1', orgsRouter(db, config, mailer));
  const sweepPool = createSweepPool();
  app.use('/api/v1/projects', projectsRouter(db));
  app.use('/api/v1/projects', scenariosRouter(db, sweepPool, config.databaseUrl));
  app.use('/api/v1', climateRouter(db));
  app.use('/api/v1', equipmentRouter(db));
  app.use('/api/v1', reportsRouter({ db, pool: sweepPool, config, mailer }));
  app.use('/api/v1', logoRouter(db));
  app.use('/api/v1', billing.router);
  if (config.devOutboxUrl) app.use('/api/v1/dev', devOutboxRouter(config.devOutboxUrl));
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
    close: async () => {
      await Promise.all([sessionPool.end(), sweepPool.close()]);
    },
  };
}
