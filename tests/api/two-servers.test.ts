/**
 * Two server processes on one PostgreSQL, as the product runs when it grows past one: nothing that
 * another process must see is kept only in one process's memory. A session made on one is valid on
 * the other; the sign-in limit counts across both; a provider webhook delivered to both is applied
 * once; a sweep computed on one is served from the cache by the other (and a change made through one
 * is never answered from the other's memory); a removed member is refused on both at once.
 */
import assert from 'node:assert/strict';
import { spawn, type ChildProcess } from 'node:child_process';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { after, before, describe, it } from 'node:test';
import { sessionSchema } from '../../shared/auth/auth-schemas';
import { billingSchema, providerPageSchema } from '../../shared/billing/billing-schemas';
import { projectListSchema } from '../../shared/projects/project-schemas';
import { scenarioSchema, sweepAnswerSchema } from '../../shared/scenarios/scenario-schemas';
import { FAKE_STRIPE_SECRET_KEY, FAKE_STRIPE_WEBHOOK_SECRET } from '../../server/config';
import { startPaymentFake, TEST_CARDS, type PaymentFake } from '../../server/fakes/payment-fake';
import { parseBody } from '../support/parse-body';
import { fixture } from '../support/scenario-fixture';
import { inviteMember, PASSWORD, signUp, useTestApp } from '../support/test-app';

const t = useTestApp();

const freePort = () =>
  new Promise<number>((resolve) => {
    const s = createServer();
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as AddressInfo;
      s.close(() => resolve(port));
    });
  });

let fake: PaymentFake;
let relay: Server;
const servers: { port: number; child: ChildProcess }[] = [];

async function startServer(): Promise<{ port: number; child: ChildProcess }> {
  const port = await freePort();
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    env: {
      ...process.env,
      NODE_ENV: 'test',
      DATABASE_URL: t.config.databaseUrl,
      SESSION_SECRET: t.config.sessionSecret,
      PORT: String(port),
      PUBLIC_URL: t.config.publicUrl,
      LOG_LEVEL: 'silent',
      CLIENT_DIST: '',
      SMTP_PORT: String(t.sink.smtpPort),
      DEV_OUTBOX_URL: '',
      STRIPE_API_HOST: '127.0.0.1',
      STRIPE_API_PORT: String(fake.port),
      STRIPE_API_PROTOCOL: 'http',
    },
    stdio: ['ignore', 'ignore', 'pipe'],
  });
  let stderr = '';
  child.stderr?.on('data', (c: Buffer) => (stderr += c.toString()));
  // Generous: on a busy machine compiling the server on start takes a while.
  for (let i = 0; i < 900 && child.exitCode === null; i++) {
    try {
      if ((await fetch(`http://127.0.0.1:${port}/api/health`)).ok) return { port, child };
    } catch {
      /* not up yet */
    }
    await new Promise((r) => setTimeout(r, 100));
  }
  child.kill('SIGKILL');
  throw new Error(`the server on port ${port} did not start: ${stderr.slice(-2000)}`);
}

async function startAll(): Promise<void> {
  fake = await startPaymentFake({
    secretKey: FAKE_STRIPE_SECRET_KEY,
    webhookSecret: FAKE_STRIPE_WEBHOOK_SECRET,
    retryBaseMs: 200,
  });
  servers.push(await startServer(), await startServer());
  // The provider's webhook goes to both servers at once, with the same signed body.
  relay = createServer((req, res) => {
    const chunks: Buffer[] = [];
    req.on('data', (c: Buffer) => chunks.push(c));
    req.on('end', () => {
      const body = Buffer.concat(chunks);
      const headers = {
        'content-type': 'application/json',
        'stripe-signature': String(req.headers['stripe-signature'] ?? ''),
      };
      void Promise.all(
        servers.map((s) =>
          fetch(`http://127.0.0.1:${s.port}/api/v1/billing/webhook`, { method: 'POST', headers, body }),
        ),
      ).then((answers) => {
        res.statusCode = answers.every((a) => a.ok) ? 200 : 500;
        res.end(answers.map((a) => a.status).join(','));
      });
    });
  });
  await new Promise<void>((resolve) => relay.listen(0, '127.0.0.1', resolve));
  fake.setWebhookUrl(`http://127.0.0.1:${(relay.address() as AddressInfo).port}/`);
}

async function stopAll(): Promise<void> {
  await Promise.all(
    servers.map(
      (s) =>
        new Promise<void>((resolve) => {
          s.child.once('exit', () => resolve());
          s.child.kill('SIGTERM');
        }),
    ),
  );
  relay.closeAllConnections();
  await new Promise<void>((resolve) => relay.close(() => resolve()));
  await fake.close();
}

/** A browser-like client of one server process: a session cookie, the CSRF header, JSON. */
function client(cookie: string) {
  return async (port: number, method: string, path: string, body?: unknown) => {
    const res = await fetch(`http://127.0.0.1:${port}${path}`, {
      method,
      headers: {
        cookie,
        'x-requested-with': 'tailroom',
        ...(body === undefined ? {} : { 'content-type': 'application/json' }),
      },
      body: body === undefined ? undefined : JSON.stringify(body),
    });
    const text = await res.text();
    const json: unknown = text ? JSON.parse(text) : null;
    return { status: res.status, body: json };
  };
}

async function signInOn(port: number, email: string, password = PASSWORD) {
  const res = await fetch(`http://127.0.0.1:${port}/api/v1/auth/sign-in`, {
    method: 'POST',
    headers: { 'content-type': 'application/json' },
    body: JSON.stringify({ email, password }),
  });
  return { status: res.status, cookie: (res.headers.get('set-cookie') ?? '').split(';')[0] ?? '' };
}

const portA = () => servers[0]?.port ?? 0;
const portB = () => servers[1]?.port ?? 0;

describe('two server processes on one database', () => {
  // Inside the suite: after the file's test app (and its configuration) exists.
  before(startAll);
  after(stopAll);

  it('accepts a session made on one server on the other', async () => {
    const owner = await signUp(t);
    const { status, cookie } = await signInOn(portA(), owner.email);
    assert.equal(status, 200);
    const call = client(cookie);
    const created = await call(portA(), 'POST', '/api/v1/projects', { name: 'Made on A' });
    assert.equal(created.status, 201);
    const session = await call(portB(), 'GET', '/api/v1/session');
    assert.equal(parseBody(sessionSchema, session).user?.email, owner.email);
    const list = await call(portB(), 'GET', '/api/v1/projects');
    assert.deepEqual(
      parseBody(projectListSchema, list).map((p) => p.name),
      ['Made on A'],
    );
    // Signing out on B ends the session on A too.
    assert.equal((await call(portB(), 'POST', '/api/v1/auth/sign-out', {})).status, 204);
    assert.equal((await call(portA(), 'GET', '/api/v1/projects')).status, 401);
  });

  it('counts failed sign-ins across both servers', async () => {
    const owner = await signUp(t);
    for (let i = 0; i < 10; i++) {
      const { status } = await signInOn(i % 2 === 0 ? portA() : portB(), owner.email, 'not the password');
      assert.equal(status, 401);
    }
    // Five failures on each: either server now refuses, even the right password.
    assert.equal((await signInOn(portA(), owner.email)).status, 429);
    assert.equal((await signInOn(portB(), owner.email)).status, 429);
  });

  it('applies a provider webhook delivered to both servers once', async () => {
    const owner = await signUp(t);
    const { cookie } = await signInOn(portA(), owner.email);
    const call = client(cookie);
    const checkout = await call(portA(), 'POST', '/api/v1/billing/checkout', { plan: 'crew', interval: 'month' });
    assert.equal(checkout.status, 201);
    const paid = await fetch(parseBody(providerPageSchema, checkout).url, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: new URLSearchParams({ card: TEST_CARDS.success }).toString(),
      redirect: 'manual',
    });
    assert.equal(paid.status, 303);
    await fake.idle();
    assert.ok(
      fake.deliveries().every((d) => d.status === 'delivered'),
      JSON.stringify(fake.deliveries()),
    );
    const billing = billingSchema.parse((await call(portB(), 'GET', '/api/v1/billing')).body);
    assert.equal(billing.usage.plan, 'crew');
    const ids = billing.events.map((e) => e.id);
    assert.equal(new Set(ids).size, ids.length, 'each event recorded once');
    const rows = await t
      .db('billing_events')
      .where({ organization_id: owner.organizationId })
      .count<{ n: string }[]>('id as n');
    assert.equal(Number(rows[0]?.n), fake.deliveries().length);
    const planChanges = (
      await t
        .db('audit_events')
        .where({ organization_id: owner.organizationId, type: 'plan_changed' })
        .count<{ n: string }[]>('id as n')
    )[0]?.n;
    assert.equal(Number(planChanges), 1, 'the plan changed once');
  });

  it('serves a sweep computed on one server from the cache on the other, and never a stale one', async () => {
    const f = await fixture(t);
    const { cookie } = await signInOn(portA(), f.email);
    const call = client(cookie);
    const base = `/api/v1/projects/${f.projectId}/scenarios`;
    const scenario = scenarioSchema.parse(
      (
        await call(portA(), 'POST', base, {
          name: 'Shared',
          settings: { optionLabels: ['F 6 kW', 'F 9 kW', 'F 14 kW'] },
        })
      ).body,
    );
    const first = await call(portA(), 'POST', `${base}/${scenario.id}/sweep`);
    assert.equal(first.status, 200);
    const firstSweep = parseBody(sweepAnswerSchema, first);
    assert.equal(firstSweep.cached, false);
    const onB = parseBody(sweepAnswerSchema, await call(portB(), 'POST', `${base}/${scenario.id}/sweep`));
    assert.equal(onB.cached, true);
    assert.equal(onB.inputHash, firstSweep.inputHash);
    assert.equal(Number((await t.db('sweep_results').count<{ n: string }[]>('input_hash as n'))[0]?.n), 1);

    // A change made through B: A must not answer from what it remembers.
    const patched = await call(portB(), 'PATCH', `${base}/${scenario.id}`, {
      version: scenario.version,
      settings: { ...scenario.settings, optionLabels: ['F 6 kW', 'F 9 kW'] },
    });
    assert.equal(patched.status, 200, JSON.stringify(patched.body));
    const afterChange = await call(portA(), 'GET', `${base}/${scenario.id}/sweep`);
    assert.equal(afterChange.status, 404, 'the changed scenario has no cached sweep yet');
    const again = parseBody(sweepAnswerSchema, await call(portA(), 'POST', `${base}/${scenario.id}/sweep`));
    assert.equal(again.cached, false);
    assert.notEqual(again.inputHash, firstSweep.inputHash);
  });

  it('refuses a removed member on both servers at once', async () => {
    const owner = await signUp(t);
    const member = await inviteMember(t, owner, 'designer');
    const onA = client((await signInOn(portA(), member.email)).cookie);
    const onB = client((await signInOn(portB(), member.email)).cookie);
    assert.equal((await onA(portA(), 'GET', '/api/v1/projects')).status, 200);
    assert.equal((await onB(portB(), 'GET', '/api/v1/projects')).status, 200);
    const ownerOnA = client((await signInOn(portA(), owner.email)).cookie);
    assert.equal((await ownerOnA(portA(), 'DELETE', `/api/v1/members/${member.userId}`)).status, 204);
    assert.equal((await onA(portA(), 'GET', '/api/v1/projects')).status, 403);
    assert.equal((await onB(portB(), 'GET', '/api/v1/projects')).status, 403);
  });
});
