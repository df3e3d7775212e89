/**
 * Mail abuse and the smaller edges: report e-mails limited per organisation and per recipient (429
 * with Retry-After and the wait in words), names sanitised before they reach a mail header, every
 * send in the audit log; failed sign-ins limited per network address; an oversize JSON body refused
 * before it is read; UTF-8 upload file names; random audit ids; the development server's own-host
 * check, the Dev outbox's access rule and the webhook secret that is not a fixed one.
 */
import assert from 'node:assert/strict';
import { createServer, request as httpRequest } from 'node:http';
import type { AddressInfo } from 'node:net';
import { describe, it } from 'node:test';
import request from 'supertest';
import { auditLogSchema, outboxMessageListSchema } from '../../shared/orgs/org-schemas';
import { reportSchema } from '../../shared/reports/report-schemas';
import { scenarioSchema, sweepAnswerSchema } from '../../shared/scenarios/scenario-schemas';
import { FAKE_STRIPE_WEBHOOK_SECRET, parseConfig } from '../../server/config';
import { headerText } from '../../server/mail/header-text';
import { parseBody, parseError } from '../support/parse-body';
import { fixture, type Fixture } from '../support/scenario-fixture';
import {
  createTestApp,
  inviteMember,
  newAgent,
  PASSWORD,
  signUp,
  uniqueEmail,
  useTestApp,
  type TestApp,
} from '../support/test-app';

const t = useTestApp();

async function reportOf(f: Fixture): Promise<string> {
  const scenario = scenarioSchema.parse(
    (
      await f.agent
        .post(`/api/v1/projects/${f.projectId}/scenarios`)
        .send({ name: 'Gas bid', settings: { optionLabels: ['F 6 kW', 'F 9 kW', 'F 14 kW'] } })
        .expect(201)
    ).body,
  );
  const sweep = parseBody(
    sweepAnswerSchema,
    await f.agent.post(`/api/v1/projects/${f.projectId}/scenarios/${scenario.id}/sweep`).expect(200),
  );
  const report = reportSchema.parse(
    (
      await f.agent
        .post(`/api/v1/projects/${f.projectId}/reports`)
        .send({ scenarioId: scenario.id, title: 'Your heating options', points: [sweep.rows[0]?.designC ?? -10] })
        .expect(201)
    ).body,
  );
  return `/api/v1/projects/${f.projectId}/reports/${report.id}`;
}

/** The fixture's owner, signed in on another app (same database) with its own configuration. */
async function ownerOn(app: TestApp, f: Fixture) {
  const agent = newAgent(app.app);
  await agent.post('/api/v1/auth/sign-in').send({ email: f.email, password: PASSWORD }).expect(200);
  return agent;
}

describe('report e-mails', () => {
  it('limits sends per recipient and per organisation with 429, Retry-After and the wait in words, and audits every send', async () => {
    const own = await createTestApp({ REPORT_SENDS_PER_HOUR: '4', REPORT_SENDS_PER_RECIPIENT_PER_DAY: '2' });
    try {
      const f = await fixture(t);
      const base = await reportOf(f);
      const owner = await ownerOn(own, f);
      await owner.post(`${base}/send`).send({ to: 'same@example.test' }).expect(201);
      await owner.post(`${base}/send`).send({ to: 'Same@Example.test' }).expect(201);
      const perRecipient = await owner.post(`${base}/send`).send({ to: 'same@example.test' }).expect(429);
      const error = parseError(perRecipient);
      assert.equal(error.code, 'rate_limited');
      assert.match(error.message, /Too many report e-mails to this address today; try again in \d+ hours/);
      const retryAfter = Number(perRecipient.headers['retry-after']);
      assert.ok(
        retryAfter > 23 * 3600 && retryAfter <= 24 * 3600,
        `Retry-After ${String(perRecipient.headers['retry-after'])}`,
      );

      // The organisation's hourly limit (4): the refused send above counted, so one more goes out.
      await owner.post(`${base}/send`).send({ to: 'other@example.test' }).expect(201);
      const perOrg = await owner.post(`${base}/send`).send({ to: 'third@example.test' }).expect(429);
      assert.match(parseError(perOrg).message, /from this organisation this hour; try again in \d+ minutes/);
      assert.ok(Number(perOrg.headers['retry-after']) <= 3600);

      // Nothing was sent past a limit; every send that went out is in the audit log.
      const sends = await t.db('report_sends').count<{ n: string }[]>('id as n');
      assert.equal(Number(sends[0]?.n), 3);
      const log = parseBody(auditLogSchema, await f.agent.get('/api/v1/audit').expect(200));
      assert.equal(log.filter((e) => e.type === 'report_sent').length, 3);

      // Another organisation is not held up by this one's limit, but the recipient's limit is everyone's.
      const g = await fixture(t);
      const otherBase = await reportOf(g);
      const other = await ownerOn(own, g);
      await other.post(`${otherBase}/send`).send({ to: 'fresh@example.test' }).expect(201);
      await other.post(`${otherBase}/send`).send({ to: 'same@example.test' }).expect(429);
    } finally {
      await own.close();
    }
  });

  it('keeps the sender’s and the organisation’s names to one clean line in the e-mail', async () => {
    const f = await fixture(t);
    // Stored as it is (as older data may be): the mail must still come out clean.
    await t.db('organizations').where({ id: f.organizationId }).update({ name: 'Acme\r\nBcc: victim@example.test' });
    await t.db('users').where({ email: f.email }).update({ name: 'Sam\u202E\nCc: victim@example.test' });
    const base = await reportOf(f);
    const mail = t.sink.waitFor((m) => m.to.includes('client@example.test'));
    await f.agent.post(`${base}/send`).send({ to: 'client@example.test' }).expect(201);
    const m = await mail;
    assert.deepEqual(m.to, ['client@example.test']);
    assert.doesNotMatch(m.subject, /[\r\n]/);
    assert.equal(t.sink.messages().filter((x) => x.to.includes('victim@example.test')).length, 0);
  });

  it('cleans header text: controls, invisible marks, quotes and angle brackets go; long text is cut', () => {
    assert.equal(headerText('Acme\r\nBcc: x@example.test'), 'Acme Bcc: x@example.test');
    assert.equal(headerText('Ac\u200Bme\u202E Heating\uFEFF'), 'Ac me Heating');
    assert.equal(headerText('"Boss" <boss@example.test>'), 'Boss boss@example.test');
    assert.equal(headerText('\uD800lone'), 'lone');
    const long = headerText('x'.repeat(300), 100);
    assert.equal(Array.from(long).length, 100);
    assert.ok(long.endsWith('…'));
  });
});

describe('sign-in from one network address', () => {
  it('limits failed sign-ins per address across accounts (password spraying)', async () => {
    const own = await createTestApp({ SIGN_IN_FAILURES_PER_ADDRESS: '5' });
    try {
      for (let i = 0; i < 5; i++) {
        await request(own.app)
          .post('/api/v1/auth/sign-in')
          .send({ email: uniqueEmail('spray'), password: 'Winter2026!' })
          .expect(401);
      }
      const limited = await request(own.app)
        .post('/api/v1/auth/sign-in')
        .send({ email: uniqueEmail('spray'), password: 'Winter2026!' })
        .expect(429);
      assert.match(parseError(limited).message, /failed sign-ins from this network address/);
      assert.ok(Number(limited.headers['retry-after']) > 0);
    } finally {
      await own.close();
    }
  });
});

describe('request edges', () => {
  it('answers 413 at once to a JSON body declared larger than the limit, without reading it', async () => {
    const server = createServer(t.app);
    await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
    try {
      const { port } = server.address() as AddressInfo;
      const t0 = performance.now();
      const status = await new Promise<number>((resolve, reject) => {
        const req = httpRequest(
          {
            host: '127.0.0.1',
            port,
            method: 'POST',
            path: '/api/v1/auth/sign-in',
            headers: { 'content-type': 'application/json', 'content-length': String(2 * 1024 ** 3) },
          },
          (res) => {
            res.resume();
            resolve(res.statusCode ?? 0);
          },
        );
        req.on('error', reject);
        req.write('{"email":"');
      });
      assert.equal(status, 413);
      assert.ok(performance.now() - t0 < 5000);
    } finally {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    }
  });

  it('keeps a UTF-8 upload file name as sent (café stays café)', async () => {
    const owner = await signUp(t);
    const res = await owner.agent
      .put('/api/v1/organization/logo')
      .attach('logo', Buffer.from('not an image at all'), 'café.txt');
    assert.ok(res.status >= 400 && res.status < 500, String(res.status));
    assert.match(JSON.stringify(res.body), /café\.txt/);
    assert.doesNotMatch(JSON.stringify(res.body), /cafÃ©/);
  });

  it('shows audit events under random ids, not one sequence shared by every organisation', async () => {
    const a = await signUp(t);
    const b = await signUp(t);
    await inviteMember(t, a, 'viewer');
    const ids = [
      ...parseBody(auditLogSchema, await a.agent.get('/api/v1/audit').expect(200)),
      ...parseBody(auditLogSchema, await b.agent.get('/api/v1/audit').expect(200)),
    ].map((e) => e.id);
    assert.ok(ids.length >= 3);
    for (const id of ids) assert.match(id, /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/);
    assert.equal(new Set(ids).size, ids.length);
  });
});

describe('development surfaces', () => {
  it('the development server refuses a Host other than its own (DNS rebinding)', async () => {
    const dev = await createTestApp({ NODE_ENV: 'development' });
    try {
      const refused = await request(dev.app).get('/api/health').set('Host', 'attacker.example:3000').expect(421);
      assert.equal(parseError(refused).code, 'unknown_host');
      await request(dev.app).get('/api/v1/dev/outbox').set('Host', 'rebound.example').expect(421);
      await request(dev.app).get('/api/health').set('Host', '127.0.0.1:3000').expect(200);
      await request(dev.app).get('/api/health').set('Host', 'localhost:4200').expect(200);
      await request(dev.app).get('/api/health').set('Host', 'tailroom.test').expect(200);
    } finally {
      await dev.close();
    }
  });

  it('the Dev outbox needs the development token or a signed-in member, who sees only their organisation’s mail', async () => {
    const owner = await signUp(t);
    const invitee = uniqueEmail('invitee');
    const mail = t.sink.waitFor((m) => m.to.includes(invitee));
    await owner.agent.post('/api/v1/invitations').send({ email: invitee, role: 'viewer' }).expect(201);
    await mail;
    const stranger = await signUp(t);

    const anonymous = await request(t.app).get('/api/v1/dev/outbox').expect(401);
    assert.equal(parseError(anonymous).code, 'unauthenticated');
    await request(t.app)
      .get('/api/v1/dev/outbox')
      .set('X-Dev-Outbox-Token', 'a-wrong-token-of-some-length')
      .expect(401);

    const all = parseBody(
      outboxMessageListSchema,
      await request(t.app).get('/api/v1/dev/outbox').set('X-Dev-Outbox-Token', t.config.devOutboxToken).expect(200),
    );
    assert.ok(all.some((m) => m.to.includes(invitee)));
    const viaQuery = parseBody(
      outboxMessageListSchema,
      await request(t.app)
        .get(`/api/v1/dev/outbox?token=${encodeURIComponent(t.config.devOutboxToken)}`)
        .expect(200),
    );
    assert.equal(viaQuery.length, all.length);

    const own = parseBody(outboxMessageListSchema, await owner.agent.get('/api/v1/dev/outbox').expect(200));
    assert.ok(own.some((m) => m.to.includes(invitee)));
    const theirs = parseBody(outboxMessageListSchema, await stranger.agent.get('/api/v1/dev/outbox').expect(200));
    assert.ok(!theirs.some((m) => m.to.includes(invitee)), 'another organisation does not see the invitation');
    assert.ok(theirs.every((m) => m.to.includes(stranger.email)));
  });

  it('has no fixed webhook secret outside tests, and a random token for the outbox', () => {
    const base = { DATABASE_URL: 'postgres://x@127.0.0.1/x', SESSION_SECRET: 's'.repeat(40) };
    const a = parseConfig({ ...base, NODE_ENV: 'development' });
    const b = parseConfig({ ...base, NODE_ENV: 'development' });
    assert.notEqual(a.stripe.webhookSecret, FAKE_STRIPE_WEBHOOK_SECRET);
    assert.notEqual(a.stripe.webhookSecret, b.stripe.webhookSecret);
    assert.notEqual(a.devOutboxToken, b.devOutboxToken);
    assert.ok(a.devOutboxToken.length >= 32);
    assert.equal(
      parseConfig({ ...base, NODE_ENV: 'development', STRIPE_WEBHOOK_SECRET: 'whsec_given' }).stripe.webhookSecret,
      'whsec_given',
    );
  });
});
