import type { Express } from 'express';
import type { Knex } from 'knex';
import { after, before, beforeEach } from 'node:test';
import request from 'supertest';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '../../shared/api/csrf';
import type { Role } from '../../shared/auth/roles';
import { createApp, type RouteInfo } from '../../server/app';
import { parseConfig, type Config } from '../../server/config';
import { createDb } from '../../server/db';
import { createLogger } from '../../server/logger';
import { createMailer, type Mailer } from '../../server/mail/mailer';
import { startSmtpSink, type SmtpSink } from '../../server/fakes/smtp-sink';

export interface TestApp {
  app: Express;
  /** The API's routes with their guards. */
  routes: () => RouteInfo[];
  /** Weather files being read in the upload pool, and waiting. */
  uploadsPending: () => { running: number; waiting: number };
  db: Knex;
  sink: SmtpSink;
  config: Config;
  close(): Promise<void>;
}

/** The production createApp() against the test database and an in-process e-mail sink. */
export async function createTestApp(overrides: Record<string, string> = {}): Promise<TestApp> {
  const databaseUrl = process.env['DATABASE_URL'];
  if (!databaseUrl) throw new Error('DATABASE_URL is not set: run the tests through `npm test`');
  const sink = await startSmtpSink();
  const config = parseConfig({
    NODE_ENV: 'test',
    DATABASE_URL: databaseUrl,
    SESSION_SECRET: 'test-session-secret-that-is-long-enough-123',
    SMTP_PORT: String(sink.smtpPort),
    DEV_OUTBOX_URL: `http://127.0.0.1:${sink.httpPort}`,
    PUBLIC_URL: 'http://tailroom.test',
    LOG_LEVEL: 'silent',
    // Many accounts are made from one address in a test file; the limit itself is tested on its own app.
    SIGN_UP_PER_HOUR: '100000',
    SIGN_IN_FAILURES_PER_ADDRESS: '100000',
    ...overrides,
  });
  const db = createDb(config.databaseUrl);
  const mailer: Mailer = createMailer(config);
  const created = createApp({ config, db, mailer, logger: createLogger('silent') });
  const { app } = created;
  return {
    app,
    routes: () => created.routes(),
    uploadsPending: () => created.uploadsPending(),
    db,
    sink,
    config,
    async close() {
      mailer.close();
      await created.close();
      await db.destroy();
      await sink.close();
    },
  };
}

/** Empties every table the app writes (the schema stays). */
export async function resetDb(db: Knex): Promise<void> {
  await db.raw(
    'TRUNCATE users, organizations, memberships, invitations, password_resets, sign_up_requests, projects, sweep_results, rate_limit_hits, "session" CASCADE',
  );
}

export const PASSWORD = 'correct horse battery';

/** A supertest agent that keeps cookies and sends the CSRF header, as the app's own pages do. */
export function newAgent(app: Express): request.Agent {
  return request.agent(app).set(CSRF_HEADER, CSRF_HEADER_VALUE);
}

let counter = 0;
export function uniqueEmail(prefix = 'user'): string {
  counter += 1;
  return `${prefix}.${Date.now().toString(36)}.${counter}@example.test`;
}

/**
 * A new account (and its own organisation) signed in on a supertest agent, made as a person makes
 * one: the sign-up form (202), the e-mailed link, and the password chosen there (201).
 */
export async function signUp(
  t: Pick<TestApp, 'app' | 'sink'>,
  fields: { email?: string; name?: string; organizationName?: string } = {},
) {
  const agent = newAgent(t.app);
  const email = fields.email ?? uniqueEmail();
  const mail = t.sink.waitFor((m) => m.to.includes(email) && m.text.includes('/finish-sign-up/'));
  await agent
    .post('/api/v1/auth/sign-up')
    .send({ email, name: fields.name ?? 'Test Person', organizationName: fields.organizationName })
    .expect(202);
  const res = await agent
    .post(`/api/v1/auth/sign-ups/${linkToken((await mail).text, '/finish-sign-up/')}`)
    .send({ password: PASSWORD })
    .expect(201);
  const body = res.body as { user: { id: string }; currentOrganizationId: string };
  return { agent, email, userId: body.user.id, organizationId: body.currentOrganizationId };
}

/** The token at the end of the first link in an e-mail whose path contains `fragment`. */
export function linkToken(text: string, fragment: string): string {
  return linkPath(text, fragment).split('/').pop() ?? '';
}

/** Extracts the path of the first link in an e-mail that contains `fragment`. */
export function linkPath(text: string, fragment: string): string {
  const match = new RegExp(`https?://[^\\s]+${fragment}[^\\s]*`).exec(text);
  if (!match) throw new Error(`no ${fragment} link in: ${text}`);
  return new URL(match[0]).pathname;
}

/**
 * The test app for one test file: created before its tests, closed after them, and the
 * database emptied before each test. Its fields are filled in by the `before` hook.
 */
export function useTestApp(): TestApp {
  const holder = {} as TestApp;
  before(async () => {
    Object.assign(holder, await createTestApp());
  });
  after(async () => {
    await holder.close();
  });
  beforeEach(async () => {
    await resetDb(holder.db);
    holder.sink.clear();
  });
  return holder;
}

/** Invites `email` into the owner's organisation as `role` and accepts by creating an account from the e-mailed link. */
export async function inviteMember(
  t: TestApp,
  owner: { agent: request.Agent },
  role: Role,
  email = uniqueEmail(role),
): Promise<{ agent: request.Agent; email: string; userId: string; token: string }> {
  const mail = t.sink.waitFor((m) => m.to.includes(email));
  await owner.agent.post('/api/v1/invitations').send({ email, role }).expect(201);
  const token = linkToken((await mail).text, '/invitations/');
  const agent = newAgent(t.app);
  const res = await agent
    .post(`/api/v1/invitation-links/${token}/account`)
    .send({ name: `A ${role}`, password: PASSWORD })
    .expect(201);
  return { agent, email, userId: (res.body as { user: { id: string } }).user.id, token };
}

/** Puts an organisation on a paid plan directly (as a confirmed subscription would), for tests that need more members or projects than the free plan holds. */
export async function setPlan(db: Knex, organizationId: string, plan: 'crew' | 'firm' = 'firm'): Promise<void> {
  await db('billing_accounts')
    .insert({ organization_id: organizationId, plan, status: 'active', interval: 'month' })
    .onConflict('organization_id')
    .merge();
}
