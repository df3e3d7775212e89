/**
 * Faults, on a PostgreSQL cluster of this test's own: the database stopped and started while the
 * server runs (fast 503s, then recovery without a restart, and a webhook the provider retries is
 * applied once), an upload cut off half-way (nothing stored), SIGTERM with a request in flight (it
 * finishes), and a backup restored (projects, scenarios and report links come back).
 */
import assert from 'node:assert/strict';
import { spawn } from 'node:child_process';
import { randomBytes } from 'node:crypto';
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer, request as httpRequest, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { after, before, describe, it } from 'node:test';
import { billingSchema, providerPageSchema } from '../../shared/billing/billing-schemas';
import { climateSiteSchema } from '../../shared/climate/climate-schemas';
import { projectListSchema } from '../../shared/projects/project-schemas';
import { linkCreatedSchema, reportSchema, reportViewSchema } from '../../shared/reports/report-schemas';
import { scenarioListSchema, scenarioSchema, sweepAnswerSchema } from '../../shared/scenarios/scenario-schemas';
import { FAKE_STRIPE_SECRET_KEY, FAKE_STRIPE_WEBHOOK_SECRET } from '../../server/config';
import { createDb } from '../../server/db';
import { startPaymentFake, TEST_CARDS, type PaymentFake } from '../../server/fakes/payment-fake';
import { migrateLatest } from '../../server/migrate';
import { loadRecord } from '../../server/modules/climate/climate-repo';
import { backupDatabase, restoreDatabase } from '../../scripts/db-backup';
import { ensurePostgresInstalled, PgCluster } from '../../scripts/pg-cluster';
import { parseBody, parseError } from '../support/parse-body';
import { fixture } from '../support/scenario-fixture';
import { createTestApp, PASSWORD, signUp, type TestApp } from '../support/test-app';

const freePort = () =>
  new Promise<number>((resolve) => {
    const s = createServer();
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as AddressInfo;
      s.close(() => resolve(port));
    });
  });

let dir = '';
let cluster: PgCluster;
let bin = '';
let databaseUrl = '';
let t: TestApp;
let fake: PaymentFake;
let server: Server;
let webhookUrl = '';

before(async () => {
  dir = mkdtempSync(path.join(tmpdir(), 'tailroom-faults-'));
  chmodSync(dir, 0o755);
  bin = ensurePostgresInstalled(() => undefined);
  cluster = new PgCluster(path.join(dir, 'pg'), await freePort(), randomBytes(12).toString('hex'), bin);
  cluster.init({ throwaway: true });
  cluster.start();
  await cluster.createDatabase('faults');
  databaseUrl = cluster.url('faults');
  const db = createDb(databaseUrl);
  await migrateLatest(db);
  await db.destroy();
  fake = await startPaymentFake({
    secretKey: FAKE_STRIPE_SECRET_KEY,
    webhookSecret: FAKE_STRIPE_WEBHOOK_SECRET,
    retryBaseMs: 250,
    maxAttempts: 12,
  });
  t = await createTestApp({
    DATABASE_URL: databaseUrl,
    STRIPE_API_HOST: '127.0.0.1',
    STRIPE_API_PORT: String(fake.port),
    STRIPE_API_PROTOCOL: 'http',
  });
  server = createServer(t.app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  webhookUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/v1/billing/webhook`;
  fake.setWebhookUrl(webhookUrl);
});

after(async () => {
  server.closeAllConnections();
  await new Promise<void>((resolve) => server.close(() => resolve()));
  await fake.close();
  await t.close();
  cluster.stop('immediate');
  rmSync(dir, { recursive: true, force: true });
});

describe('faults', () => {
  it('answers 503 fast while the database is down, recovers without a restart, and applies a retried webhook once', async () => {
    const owner = await signUp(t);
    await owner.agent.post('/api/v1/projects').send({ name: 'Before the outage' }).expect(201);
    const checkout = await owner.agent
      .post('/api/v1/billing/checkout')
      .send({ plan: 'crew', interval: 'month' })
      .expect(201);

    cluster.stop('fast');
    const t0 = performance.now();
    const down = await owner.agent.get('/api/v1/projects');
    const elapsed = performance.now() - t0;
    assert.equal(down.status, 503);
    assert.equal(parseError(down).code, 'database_unavailable');
    assert.ok(elapsed < 8000, `answered in ${elapsed.toFixed(0)} ms`);
    const write = await owner.agent.post('/api/v1/projects').send({ name: 'During the outage' });
    assert.equal(write.status, 503);

    // The provider's events arrive while the database is down: refused, then retried by the provider.
    const paid = await fetch(parseBody(providerPageSchema, checkout).url, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ card: TEST_CARDS.success }).toString(),
      redirect: 'manual',
    });
    assert.equal(paid.status, 303);
    await new Promise((r) => setTimeout(r, 600));
    assert.ok(
      fake.deliveries().every((d) => d.status === 'pending' && d.lastStatusCode === 503),
      JSON.stringify(fake.deliveries()),
    );

    cluster.start();
    await fake.idle();
    const back = await owner.agent.get('/api/v1/projects').expect(200);
    assert.deepEqual(
      parseBody(projectListSchema, back).map((p) => p.name),
      ['Before the outage'],
    );
    const billing = billingSchema.parse((await owner.agent.get('/api/v1/billing').expect(200)).body);
    assert.equal(billing.usage.plan, 'crew');
    assert.equal(billing.events.length, 2);
    assert.ok(fake.deliveries().every((d) => d.status === 'delivered' && d.attempts >= 2));
  });

  it('stores nothing of an upload cut off half-way', async () => {
    const owner = await signUp(t);
    const site = await owner.agent
      .post('/api/v1/climate-sites')
      .send({ name: 'Cut-off test (invented)', sourceKind: 'hourly' })
      .expect(201);
    const { port } = server.address() as AddressInfo;
    const signIn = await fetch(`http://127.0.0.1:${port}/api/v1/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: owner.email, password: PASSWORD }),
    });
    const cookie = (signIn.headers.get('set-cookie') ?? '').split(';')[0] ?? '';
    const boundary = 'tailroomcutoff';
    await new Promise<void>((resolve) => {
      const req = httpRequest({
        host: '127.0.0.1',
        port,
        method: 'POST',
        path: `/api/v1/climate-sites/${parseBody(climateSiteSchema, site).id}/uploads`,
        headers: {
          'content-type': `multipart/form-data; boundary=${boundary}`,
          'content-length': '1000000',
          cookie,
          'X-Requested-With': 'tailroom',
        },
      });
      req.on('error', () => resolve());
      req.on('close', () => resolve());
      req.write(
        `--${boundary}\r\nContent-Disposition: form-data; name="files"; filename="part.csv"\r\nContent-Type: text/csv\r\n\r\ntime,dry_bulb_c\r\n2001-01-01T00:00Z,-5\r\n`,
      );
      setTimeout(() => req.destroy(), 200);
    });
    await new Promise((r) => setTimeout(r, 300));
    assert.equal((await t.db('climate_uploads').count<{ n: number }[]>('id as n'))[0]?.n, 0);
    await owner.agent.get('/api/v1/climate-sites').expect(200);
  });

  it('finishes a request in flight when told to stop (SIGTERM), then exits cleanly', async () => {
    const port = await freePort();
    const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
      env: {
        ...process.env,
        NODE_ENV: 'test',
        DATABASE_URL: databaseUrl,
        SESSION_SECRET: 'x'.repeat(40),
        PORT: String(port),
        LOG_LEVEL: 'silent',
        CLIENT_DIST: '',
      },
      stdio: 'ignore',
    });
    const exited = new Promise<number | null>((resolve) => child.on('exit', (code) => resolve(code)));
    // Up to a minute to start: on a busy machine compiling and starting the server takes well over 10 s.
    for (let i = 0; i < 600; i++) {
      try {
        if ((await fetch(`http://127.0.0.1:${port}/api/health`)).ok) break;
      } catch {
        /* not up yet */
      }
      await new Promise((r) => setTimeout(r, 100));
    }
    // A request whose body is still arriving when the signal comes.
    const body = JSON.stringify({ email: `late.${Date.now()}@example.test`, name: 'Late' });
    const answer = new Promise<number>((resolve, reject) => {
      const req = httpRequest(
        {
          host: '127.0.0.1',
          port,
          method: 'POST',
          path: '/api/v1/auth/sign-up',
          // With 100-continue the server says when it has read the headers: the request is then in
          // flight however busy the machine, and the signal comes before its body.
          headers: {
            'content-type': 'application/json',
            'content-length': Buffer.byteLength(body),
            expect: '100-continue',
          },
        },
        (res) => {
          res.resume();
          res.on('end', () => resolve(res.statusCode ?? 0));
        },
      );
      req.on('error', reject);
      req.on('continue', () => {
        req.write(body.slice(0, 10));
        child.kill('SIGTERM');
        setTimeout(() => req.end(body.slice(10)), 300);
      });
      req.flushHeaders();
    });
    assert.equal(await answer, 202);
    assert.equal(await exited, 0);
  });

  it('restores every project, scenario, report link and hourly record from a backup', async () => {
    const f = await fixture(t);
    const record = await loadRecord(t.db, f.siteId);
    const storedRow = () =>
      t.db('climate_records').where({ climate_site_id: f.siteId }).first('hour_count', 'sweep_index_key');
    const scenario = scenarioSchema.parse(
      (await f.agent.post(`/api/v1/projects/${f.projectId}/scenarios`).send({ name: 'Backed up' }).expect(201)).body,
    );
    const sweep = parseBody(
      sweepAnswerSchema,
      await f.agent.post(`/api/v1/projects/${f.projectId}/scenarios/${scenario.id}/sweep`).expect(200),
    );
    const report = reportSchema.parse(
      (
        await f.agent
          .post(`/api/v1/projects/${f.projectId}/reports`)
          .send({ scenarioId: scenario.id, title: 'Backed-up report', points: [sweep.rows[0]?.designC ?? -10] })
          .expect(201)
      ).body,
    );
    const { url } = parseBody(
      linkCreatedSchema,
      await f.agent.post(`/api/v1/projects/${f.projectId}/reports/${report.id}/links`).send({}).expect(201),
    );
    const token = url.split('/r/')[1] ?? '';
    const file = path.join(dir, 'backup.dump');
    const rowBefore: unknown = await storedRow();
    backupDatabase(databaseUrl, file, bin);

    await f.agent.delete(`/api/v1/projects/${f.projectId}`).expect(204);
    await f.agent.delete(`/api/v1/climate-sites/${f.siteId}`).expect(204);
    assert.equal(await storedRow(), undefined, 'the record went with its site');
    await f.agent.get(`/api/v1/projects/${f.projectId}`).expect(404);
    await f.agent.get(`/api/v1/public/reports/${token}`).expect(404);

    restoreDatabase(databaseUrl, file, bin);
    await f.agent.get(`/api/v1/projects/${f.projectId}`).expect(200);
    const scenarios = scenarioListSchema.parse(
      (await f.agent.get(`/api/v1/projects/${f.projectId}/scenarios`).expect(200)).body,
    );
    assert.deepEqual(
      scenarios.map((s) => s.name),
      ['Backed up'],
    );
    const view = parseBody(reportViewSchema, await f.agent.get(`/api/v1/public/reports/${token}`).expect(200));
    assert.equal(view.title, 'Backed-up report');
    // The record comes back as it was stored: every hour and value, and its sweep index.
    assert.deepEqual(await storedRow(), rowBefore);
    assert.deepEqual(await loadRecord(t.db, f.siteId), record);
  });
});
