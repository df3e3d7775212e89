/**
 * Plans and billing through the provider's SDK against the local fake provider: checkout with the
 * provider's documented test cards, signed webhooks (bad signature refused, replays recorded once,
 * out-of-order events ending in the provider's state), retries while Tailroom is unreachable,
 * cancellation at period end, plan limits (402) and who may reach billing.
 */
import assert from 'node:assert/strict';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import { after, before, beforeEach, describe, it } from 'node:test';
import request from 'supertest';
import Stripe from 'stripe';
import {
  billingSchema,
  providerPageSchema,
  usageSchema,
  webhookAnswerSchema,
} from '../../shared/billing/billing-schemas';
import { FAKE_STRIPE_SECRET_KEY, FAKE_STRIPE_WEBHOOK_SECRET } from '../../server/config';
import { startPaymentFake, TEST_CARDS, type PaymentFake } from '../../server/fakes/payment-fake';
import { parseBody, parseError } from '../support/parse-body';
import { createTestApp, inviteMember, resetDb, signUp, uniqueEmail, type TestApp } from '../support/test-app';

let t: TestApp;
let fake: PaymentFake;
let server: Server;
let webhookUrl = '';
const sdk = new Stripe(FAKE_STRIPE_SECRET_KEY);

before(async () => {
  fake = await startPaymentFake({
    secretKey: FAKE_STRIPE_SECRET_KEY,
    webhookSecret: FAKE_STRIPE_WEBHOOK_SECRET,
    retryBaseMs: 40,
    maxAttempts: 10,
  });
  t = await createTestApp({
    STRIPE_API_HOST: '127.0.0.1',
    STRIPE_API_PORT: String(fake.port),
    STRIPE_API_PROTOCOL: 'http',
  });
  server = createServer(t.app);
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  webhookUrl = `http://127.0.0.1:${(server.address() as AddressInfo).port}/api/v1/billing/webhook`;
});
after(async () => {
  server.closeAllConnections();
  await new Promise<void>((resolve) => server.close(() => resolve()));
  await fake.close();
  await t.close();
});
beforeEach(async () => {
  await resetDb(t.db);
  fake.setWebhookUrl(webhookUrl);
});

/** Pays on the fake's hosted checkout page as a browser would (form post). */
async function pay(
  checkoutUrl: string,
  card: string,
): Promise<{ status: number; location: string | null; text: string }> {
  const res = await fetch(checkoutUrl, {
    method: 'POST',
    headers: { 'content-type': 'application/x-www-form-urlencoded' },
    body: new URLSearchParams({ card, exp: '12 / 34' }).toString(),
    redirect: 'manual',
  });
  return { status: res.status, location: res.headers.get('location'), text: await res.text() };
}

async function upgrade(owner: Awaited<ReturnType<typeof signUp>>, card: string = TEST_CARDS.success) {
  const res = await owner.agent.post('/api/v1/billing/checkout').send({ plan: 'crew', interval: 'month' }).expect(201);
  const { url } = parseBody(providerPageSchema, res);
  assert.ok(url.startsWith(fake.url + '/pay/'));
  const page = await fetch(url);
  assert.match(await page.text(), /Card number/);
  const paid = await pay(url, card);
  await fake.idle();
  return paid;
}

const billingOf = async (owner: Awaited<ReturnType<typeof signUp>>) =>
  billingSchema.parse((await owner.agent.get('/api/v1/billing').expect(200)).body);

function signed(event: object): { body: string; header: string } {
  const body = JSON.stringify(event);
  return { body, header: sdk.webhooks.generateTestHeaderString({ payload: body, secret: FAKE_STRIPE_WEBHOOK_SECRET }) };
}

describe('billing', () => {
  it('refuses the fourth project on the free plan with 402, then allows it once the provider confirms a paid plan', async () => {
    const owner = await signUp(t);
    const from = fake.deliveries().length;
    for (const name of ['One', 'Two', 'Three']) await owner.agent.post('/api/v1/projects').send({ name }).expect(201);
    const refused = await owner.agent.post('/api/v1/projects').send({ name: 'Four' }).expect(402);
    assert.equal(parseError(refused).code, 'plan_limit');
    assert.match(parseError(refused).message, /Starter plan holds 3 active projects/);
    assert.equal((await t.db('projects').count<{ n: number }[]>('id as n'))[0]?.n, 3);
    const usage = parseBody(usageSchema, await owner.agent.get('/api/v1/billing/usage').expect(200));
    assert.deepEqual(usage.projects, { used: 3, limit: 3 });

    const paid = await upgrade(owner);
    assert.equal(paid.status, 303);
    assert.equal(paid.location, 'http://tailroom.test/billing?checkout=success');
    const b = await billingOf(owner);
    assert.equal(b.usage.plan, 'crew');
    assert.equal(b.status, 'active');
    assert.equal(b.interval, 'month');
    assert.ok(b.currentPeriodEnd && new Date(b.currentPeriodEnd) > new Date());
    await owner.agent.post('/api/v1/projects').send({ name: 'Four' }).expect(201);

    // One recorded event per provider event, each applied.
    const delivered = fake.deliveries().slice(from);
    assert.equal(delivered.length, 2);
    assert.ok(delivered.every((d) => d.status === 'delivered'));
    assert.deepEqual(b.events.map((e) => e.id).sort(), delivered.map((d) => d.eventId).sort());
    assert.ok(b.events.every((e) => e.outcome.startsWith('applied')));
  });

  it('keeps the free plan after a declined card', async () => {
    const owner = await signUp(t);
    const before = fake.deliveries().length;
    const paid = await upgrade(owner, TEST_CARDS.declined);
    assert.equal(paid.status, 402);
    assert.match(paid.text, /declined/);
    const b = await billingOf(owner);
    assert.equal(b.usage.plan, 'starter');
    assert.equal(b.status, 'none');
    assert.equal(fake.deliveries().length, before);
  });

  it('refuses a webhook with a bad signature and changes nothing', async () => {
    const event = {
      id: 'evt_forged',
      object: 'event',
      type: 'customer.subscription.updated',
      created: 1,
      data: { object: {} },
    };
    const body = JSON.stringify(event);
    const header = sdk.webhooks.generateTestHeaderString({ payload: body, secret: 'whsec_not_the_right_one' });
    const res = await request(t.app)
      .post('/api/v1/billing/webhook')
      .set('content-type', 'application/json')
      .set('stripe-signature', header)
      .send(body)
      .expect(400);
    assert.equal(parseError(res).code, 'bad_signature');
    await request(t.app).post('/api/v1/billing/webhook').set('content-type', 'application/json').send(body).expect(400);
    assert.equal((await t.db('billing_events').count<{ n: number }[]>('id as n'))[0]?.n, 0);
  });

  it('records a replayed event once, and ends in the provider’s state when events arrive out of order', async () => {
    const owner = await signUp(t);
    await upgrade(owner);
    const account = await t
      .db('billing_accounts')
      .where({ organization_id: owner.organizationId })
      .first<{ subscription_id: string }>('subscription_id');
    // The provider cancels the subscription; its own event is delivered and applied.
    await fetch(`${fake.url}/_fake/subscriptions/${account.subscription_id}/status`, {
      method: 'POST',
      headers: { 'content-type': 'application/x-www-form-urlencoded' },
      body: 'status=canceled',
    });
    await fake.idle();
    assert.equal((await billingOf(owner)).status, 'canceled');

    // An older "active" event arrives late, twice: recorded once, and the state stays the provider's.
    const late = {
      id: 'evt_late_active',
      object: 'event',
      api_version: '2025-10-29.clover',
      created: 1,
      type: 'customer.subscription.updated',
      livemode: false,
      pending_webhooks: 1,
      request: { id: null },
      data: {
        object: {
          id: account.subscription_id,
          object: 'subscription',
          status: 'active',
          customer: 'cus_x',
          metadata: {},
          cancel_at_period_end: false,
          items: { data: [] },
        },
      },
    };
    const { body, header } = signed(late);
    const first = await request(t.app)
      .post('/api/v1/billing/webhook')
      .set('content-type', 'application/json')
      .set('stripe-signature', header)
      .send(body)
      .expect(200);
    const again = await request(t.app)
      .post('/api/v1/billing/webhook')
      .set('content-type', 'application/json')
      .set('stripe-signature', header)
      .send(body)
      .expect(200);
    assert.match(parseBody(webhookAnswerSchema, first).outcome, /^applied: crew canceled/);
    assert.match(parseBody(webhookAnswerSchema, again).outcome, /^duplicate/);
    assert.equal(
      (await t.db('billing_events').where({ id: 'evt_late_active' }).count<{ n: number }[]>('id as n'))[0]?.n,
      1,
    );
    const b = await billingOf(owner);
    assert.equal(b.status, 'canceled');
    assert.equal(b.usage.plan, 'starter');
  });

  it('retries delivery while Tailroom cannot be reached, and applies each event once when it can', async () => {
    const owner = await signUp(t);
    const from = fake.deliveries().length;
    fake.setWebhookUrl('http://127.0.0.1:9/api/v1/billing/webhook');
    const res = await owner.agent.post('/api/v1/billing/checkout').send({ plan: 'firm', interval: 'year' }).expect(201);
    await pay(parseBody(providerPageSchema, res).url, TEST_CARDS.success);
    await new Promise((r) => setTimeout(r, 200));
    const waiting = fake.deliveries().slice(from);
    assert.equal(waiting.length, 2);
    assert.ok(
      waiting.every((d) => d.status === 'pending' && d.attempts >= 2),
      JSON.stringify(waiting),
    );
    assert.equal((await billingOf(owner)).usage.plan, 'starter');
    fake.setWebhookUrl(webhookUrl);
    await fake.idle();
    const b = await billingOf(owner);
    assert.equal(b.usage.plan, 'firm');
    assert.equal(b.interval, 'year');
    assert.equal(b.events.length, 2);
  });

  it('cancels at the end of the period: the plan stays until then', async () => {
    const owner = await signUp(t);
    await upgrade(owner);
    await owner.agent.post('/api/v1/billing/cancel').send({}).expect(202);
    await fake.idle();
    const b = await billingOf(owner);
    assert.equal(b.cancelAtPeriodEnd, true);
    assert.equal(b.status, 'active');
    assert.equal(b.usage.plan, 'crew');
    const portal = await owner.agent.post('/api/v1/billing/portal').send({}).expect(201);
    assert.match(parseBody(providerPageSchema, portal).url, /\/portal\/bps_/);
  });

  it('holds three members on the free plan, counting open invitations', async () => {
    const owner = await signUp(t);
    await owner.agent
      .post('/api/v1/invitations')
      .send({ email: uniqueEmail('first'), role: 'designer' })
      .expect(201);
    await owner.agent
      .post('/api/v1/invitations')
      .send({ email: uniqueEmail('second'), role: 'viewer' })
      .expect(201);
    const refused = await owner.agent
      .post('/api/v1/invitations')
      .send({ email: uniqueEmail('third'), role: 'viewer' })
      .expect(402);
    assert.match(parseError(refused).message, /Starter plan holds 3 members/);
  });

  it('is for owners only', async () => {
    const owner = await signUp(t);
    const designer = await inviteMember(t, owner, 'designer');
    await designer.agent.get('/api/v1/billing').expect(403);
    await designer.agent.post('/api/v1/billing/checkout').send({ plan: 'crew', interval: 'month' }).expect(403);
    await designer.agent.post('/api/v1/billing/cancel').send({}).expect(403);
    await designer.agent.post('/api/v1/billing/portal').send({}).expect(403);
    await designer.agent.get('/api/v1/billing/usage').expect(200);
    await owner.agent.post('/api/v1/billing/checkout').send({ plan: 'gold', interval: 'month' }).expect(400);
  });
});
