/**
 * A local stand-in for the payment provider, for development and tests: the part of its REST API
 * that Tailroom's SDK calls (customers, checkout sessions, subscriptions, billing-portal sessions),
 * answering in the shapes the SDK parses; its own hosted checkout and portal pages, where the
 * provider's documented test cards succeed or are declined; and signed webhook delivery (the same
 * `t=…,v1=HMAC-SHA256` scheme the SDK verifies), retried with back-off until Tailroom answers 2xx.
 * State lives in memory.
 */
import { randomBytes } from 'node:crypto';
import { createServer, type Server } from 'node:http';
import type { AddressInfo } from 'node:net';
import express, { type Request, type Response } from 'express';
import Stripe from 'stripe';

/** Test card numbers from the provider's testing documentation. */
export const TEST_CARDS = {
  success: '4242424242424242',
  declined: '4000000000000002',
  insufficientFunds: '4000000000009995',
} as const;

const PERIOD_DAYS: Record<string, number> = { month: 30, year: 365 };

type Obj = Record<string, unknown> & { id: string };

export interface Delivery {
  eventId: string;
  type: string;
  attempts: number;
  status: 'pending' | 'delivered' | 'failed';
  lastStatusCode: number | null;
}

export interface PaymentFakeOptions {
  port?: number;
  secretKey: string;
  webhookSecret: string;
  /** Where events are delivered (Tailroom's webhook endpoint); none: events are only recorded. */
  webhookUrl?: string;
  /** First retry delay, ms (doubles each attempt). */
  retryBaseMs?: number;
  maxAttempts?: number;
}

export interface PaymentFake {
  url: string;
  port: number;
  setWebhookUrl(url: string): void;
  deliveries(): Delivery[];
  /** Resolves when no delivery is pending. */
  idle(): Promise<void>;
  close(): Promise<void>;
}

const newId = (prefix: string) => `${prefix}_${randomBytes(12).toString('hex')}`;
const escapeHtml = (s: string) =>
  s.replace(/[&<>"']/g, (c) => ({ '&': '&amp;', '<': '&lt;', '>': '&gt;', '"': '&quot;', "'": '&#39;' })[c] ?? c);

function page(title: string, body: string): string {
  return `<!doctype html><html lang="en"><head><meta charset="utf-8"><meta name="viewport" content="width=device-width, initial-scale=1">
<title>${escapeHtml(title)} · Payment provider (local test fake)</title>
<style>body{font-family:system-ui,sans-serif;background:#f3f4f6;color:#1f2937;margin:0}main{max-width:26rem;margin:3rem auto;background:#fff;border-radius:10px;padding:1.5rem;box-shadow:0 2px 8px #0002}
label{display:block;margin:.75rem 0 .25rem}input{width:100%;box-sizing:border-box;padding:.6rem;font-size:1rem;border:1px solid #9ca3af;border-radius:6px}
button{margin-top:1rem;width:100%;padding:.7rem;font-size:1rem;background:#374151;color:#fff;border:0;border-radius:6px;cursor:pointer}.error{color:#b91c1c}.note{font-size:.85rem;color:#6b7280}</style></head>
<body><main>${body}<p class="note">Local test fake of the payment provider. No real payment is taken.</p></main></body></html>`;
}

export async function startPaymentFake(options: PaymentFakeOptions): Promise<PaymentFake> {
  const sdk = new Stripe(options.secretKey);
  const retryBase = options.retryBaseMs ?? 500;
  const maxAttempts = options.maxAttempts ?? 8;
  let webhookUrl = options.webhookUrl;
  const customers = new Map<string, Obj>();
  const sessions = new Map<string, Obj>();
  const subscriptions = new Map<string, Obj>();
  const portals = new Map<string, Obj>();
  const deliveries = new Map<string, Delivery>();
  const timers = new Set<NodeJS.Timeout>();
  let lastCreated = 0;
  let baseUrl = '';

  const app = express();
  app.disable('x-powered-by');
  app.use(express.urlencoded({ extended: true, limit: '100kb' }));

  const apiError = (res: Response, status: number, message: string, code?: string) =>
    res.status(status).json({
      error: {
        type: status === 401 ? 'authentication_error' : 'invalid_request_error',
        message,
        ...(code ? { code } : {}),
      },
    });

  const authed = (req: Request, res: Response): boolean => {
    if (req.headers.authorization !== `Bearer ${options.secretKey}`) {
      apiError(res, 401, 'Invalid API Key provided');
      return false;
    }
    return true;
  };

  function deliver(event: Obj, attempt: number): void {
    const d = deliveries.get(event.id);
    if (!d || !webhookUrl) return;
    const payload = JSON.stringify(event);
    const header = sdk.webhooks.generateTestHeaderString({ payload, secret: options.webhookSecret });
    d.attempts = attempt;
    void fetch(webhookUrl, {
      method: 'POST',
      headers: { 'content-type': 'application/json', 'stripe-signature': header },
      body: payload,
    })
      .then((r) => r.status)
      .catch(() => 0)
      .then((status) => {
        d.lastStatusCode = status || null;
        if (status >= 200 && status < 300) {
          d.status = 'delivered';
        } else if (attempt >= maxAttempts) {
          d.status = 'failed';
        } else {
          const t = setTimeout(
            () => {
              timers.delete(t);
              deliver(event, attempt + 1);
            },
            retryBase * 2 ** (attempt - 1),
          );
          timers.add(t);
        }
      });
  }

  function emit(type: string, object: Obj): Obj {
    lastCreated = Math.max(Math.floor(Date.now() / 1000), lastCreated + 1);
    const event: Obj = {
      id: newId('evt'),
      object: 'event',
      api_version: '2025-10-29.clover',
      created: lastCreated,
      type,
      livemode: false,
      pending_webhooks: 1,
      request: { id: null, idempotency_key: null },
      data: { object: structuredClone(object) },
    };
    deliveries.set(event.id, { eventId: event.id, type, attempts: 0, status: 'pending', lastStatusCode: null });
    deliver(event, 1);
    return event;
  }

  function newSubscription(session: Obj, interval: string): Obj {
    const now = Math.floor(Date.now() / 1000);
    const end = now + (PERIOD_DAYS[interval] ?? 30) * 86_400;
    const price = (session['line_items_price'] as string | undefined) ?? '';
    const sub: Obj = {
      id: newId('sub'),
      object: 'subscription',
      customer: session['customer'],
      status: 'active',
      cancel_at_period_end: false,
      canceled_at: null,
      created: now,
      start_date: now,
      metadata: session['subscription_metadata'] ?? {},
      items: {
        object: 'list',
        data: [
          {
            id: newId('si'),
            object: 'subscription_item',
            price: { id: price, object: 'price', recurring: { interval } },
            quantity: 1,
            current_period_start: now,
            current_period_end: end,
          },
        ],
      },
      livemode: false,
    };
    subscriptions.set(sub.id, sub);
    return sub;
  }

  // --- REST API ------------------------------------------------------------------------------

  app.post('/v1/customers', (req, res) => {
    if (!authed(req, res)) return;
    const body = req.body as Record<string, unknown>;
    const c: Obj = {
      id: newId('cus'),
      object: 'customer',
      email: body['email'] ?? null,
      name: body['name'] ?? null,
      metadata: body['metadata'] ?? {},
      livemode: false,
    };
    customers.set(c.id, c);
    res.json(c);
  });

  app.get('/v1/customers/:id', (req, res) => {
    if (!authed(req, res)) return;
    const c = customers.get(req.params.id);
    if (!c) return void apiError(res, 404, `No such customer: '${req.params.id}'`, 'resource_missing');
    res.json(c);
  });

  app.post('/v1/checkout/sessions', (req, res) => {
    if (!authed(req, res)) return;
    const body = req.body as {
      customer?: string;
      mode?: string;
      success_url?: string;
      cancel_url?: string;
      client_reference_id?: string;
      line_items?: { price?: string; quantity?: string }[];
      subscription_data?: { metadata?: Record<string, string> };
      metadata?: Record<string, string>;
    };
    const price = body.line_items?.[0]?.price;
    if (body.mode !== 'subscription' || !price || !body.success_url || !body.cancel_url) {
      return void apiError(
        res,
        400,
        'mode=subscription, line_items[0][price], success_url and cancel_url are required',
        'parameter_missing',
      );
    }
    if (!body.customer || !customers.has(body.customer))
      return void apiError(res, 400, `No such customer: '${body.customer ?? ''}'`, 'resource_missing');
    const id = newId('cs_test');
    const s: Obj = {
      id,
      object: 'checkout.session',
      mode: 'subscription',
      status: 'open',
      payment_status: 'unpaid',
      customer: body.customer,
      client_reference_id: body.client_reference_id ?? null,
      success_url: body.success_url,
      cancel_url: body.cancel_url,
      metadata: body.metadata ?? {},
      subscription: null,
      url: `${baseUrl}/pay/${id}`,
      livemode: false,
      line_items_price: price,
      subscription_metadata: body.subscription_data?.metadata ?? {},
    };
    sessions.set(id, s);
    res.json(s);
  });

  app.get('/v1/checkout/sessions/:id', (req, res) => {
    if (!authed(req, res)) return;
    const s = sessions.get(req.params.id);
    if (!s) return void apiError(res, 404, `No such checkout session: '${req.params.id}'`, 'resource_missing');
    res.json(s);
  });

  app.get('/v1/subscriptions/:id', (req, res) => {
    if (!authed(req, res)) return;
    const sub = subscriptions.get(req.params.id);
    if (!sub) return void apiError(res, 404, `No such subscription: '${req.params.id}'`, 'resource_missing');
    res.json(sub);
  });

  app.post('/v1/subscriptions/:id', (req, res) => {
    if (!authed(req, res)) return;
    const sub = subscriptions.get(req.params.id);
    if (!sub) return void apiError(res, 404, `No such subscription: '${req.params.id}'`, 'resource_missing');
    const body = req.body as { cancel_at_period_end?: string };
    if (body.cancel_at_period_end !== undefined) sub['cancel_at_period_end'] = body.cancel_at_period_end === 'true';
    emit('customer.subscription.updated', sub);
    res.json(sub);
  });

  app.delete('/v1/subscriptions/:id', (req, res) => {
    if (!authed(req, res)) return;
    const sub = subscriptions.get(req.params.id);
    if (!sub) return void apiError(res, 404, `No such subscription: '${req.params.id}'`, 'resource_missing');
    sub['status'] = 'canceled';
    sub['canceled_at'] = Math.floor(Date.now() / 1000);
    emit('customer.subscription.deleted', sub);
    res.json(sub);
  });

  app.post('/v1/billing_portal/sessions', (req, res) => {
    if (!authed(req, res)) return;
    const body = req.body as { customer?: string; return_url?: string };
    if (!body.customer || !customers.has(body.customer))
      return void apiError(res, 400, `No such customer: '${body.customer ?? ''}'`, 'resource_missing');
    const id = newId('bps');
    const p: Obj = {
      id,
      object: 'billing_portal.session',
      customer: body.customer,
      return_url: body.return_url ?? null,
      url: `${baseUrl}/portal/${id}`,
      livemode: false,
    };
    portals.set(id, p);
    res.json(p);
  });

  // --- Hosted pages ---------------------------------------------------------------------------

  function checkoutPage(s: Obj, error = ''): string {
    const price = String(s['line_items_price']);
    return page(
      'Checkout',
      `<h1>Subscribe</h1><p>Plan price: <strong>${escapeHtml(price)}</strong></p>
${error ? `<p class="error" role="alert">${escapeHtml(error)}</p>` : ''}
<form method="post"><label for="card">Card number</label><input id="card" name="card" inputmode="numeric" autocomplete="off" placeholder="4242 4242 4242 4242">
<label for="exp">Expiry</label><input id="exp" name="exp" placeholder="12 / 34"><button type="submit">Pay and subscribe</button></form>
<p><a href="${escapeHtml(String(s['cancel_url']))}">Cancel and go back</a></p>
<p class="note">Test cards: ${TEST_CARDS.success} succeeds; ${TEST_CARDS.declined} is declined; ${TEST_CARDS.insufficientFunds} has insufficient funds.</p>`,
    );
  }

  app.get('/pay/:id', (req, res) => {
    const s = sessions.get(req.params.id);
    if (s?.['status'] !== 'open')
      return void res.status(404).type('html').send(page('Not found', '<h1>This checkout is closed or unknown</h1>'));
    res.type('html').send(checkoutPage(s));
  });

  app.post('/pay/:id', (req, res) => {
    const s = sessions.get(req.params.id);
    if (s?.['status'] !== 'open')
      return void res.status(404).type('html').send(page('Not found', '<h1>This checkout is closed or unknown</h1>'));
    const card = ((req.body as { card?: string }).card ?? '').replace(/\D/g, '');
    if (card === TEST_CARDS.declined)
      return void res.status(402).type('html').send(checkoutPage(s, 'Your card was declined.'));
    if (card === TEST_CARDS.insufficientFunds)
      return void res.status(402).type('html').send(checkoutPage(s, 'Your card has insufficient funds.'));
    if (card !== TEST_CARDS.success)
      return void res.status(400).type('html').send(checkoutPage(s, 'Your card number is incorrect.'));
    const interval = /_(month|year)$/.exec(String(s['line_items_price']))?.[1] ?? 'month';
    const sub = newSubscription(s, interval);
    s['status'] = 'complete';
    s['payment_status'] = 'paid';
    s['subscription'] = sub.id;
    emit('customer.subscription.created', sub);
    emit('checkout.session.completed', s);
    res.redirect(303, String(s['success_url']).replace('{CHECKOUT_SESSION_ID}', s.id));
  });

  app.get('/portal/:id', (req, res) => {
    const p = portals.get(req.params.id);
    if (!p) return void res.status(404).type('html').send(page('Not found', '<h1>Unknown portal session</h1>'));
    const subs = [...subscriptions.values()].filter(
      (x) => x['customer'] === p['customer'] && x['status'] !== 'canceled',
    );
    const rows = subs
      .map((x) => {
        const item = (x['items'] as { data: { price: { id: string }; current_period_end: number }[] }).data[0];
        const end = new Date((item?.current_period_end ?? 0) * 1000).toISOString().slice(0, 10);
        return `<p><strong>${escapeHtml(item?.price.id ?? '')}</strong>, ${x['cancel_at_period_end'] ? `ends ${end}` : `renews ${end}`}</p>
${x['cancel_at_period_end'] ? '' : `<form method="post" action="/portal/${p.id}/cancel/${x.id}"><button type="submit">Cancel at the end of the period</button></form>`}`;
      })
      .join('');
    res
      .type('html')
      .send(
        page(
          'Billing portal',
          `<h1>Your subscription</h1>${rows || '<p>No active subscription.</p>'}<p><a href="${escapeHtml(typeof p['return_url'] === 'string' ? p['return_url'] : '/')}">Return</a></p>`,
        ),
      );
  });

  app.post('/portal/:id/cancel/:sub', (req, res) => {
    const p = portals.get(req.params.id);
    const sub = subscriptions.get(req.params.sub);
    if (!p || !sub || sub['customer'] !== p['customer'])
      return void res.status(404).type('html').send(page('Not found', '<h1>Unknown subscription</h1>'));
    sub['cancel_at_period_end'] = true;
    emit('customer.subscription.updated', sub);
    res.redirect(303, `/portal/${p.id}`);
  });

  // --- Test controls (not part of the provider's API) --------------------------------------

  app.post('/_fake/subscriptions/:id/status', (req, res) => {
    const sub = subscriptions.get(req.params.id);
    if (!sub) return void res.status(404).json({ error: 'unknown subscription' });
    const status = (req.body as { status?: string }).status ?? '';
    sub['status'] = status;
    emit(status === 'canceled' ? 'customer.subscription.deleted' : 'customer.subscription.updated', sub);
    res.json(sub);
  });

  app.get('/_fake/deliveries', (_req, res) => {
    res.json([...deliveries.values()]);
  });

  const server: Server = createServer(app);
  await new Promise<void>((resolve) => server.listen(options.port ?? 0, '127.0.0.1', resolve));
  const port = (server.address() as AddressInfo).port;
  baseUrl = `http://127.0.0.1:${port}`;
  return {
    url: baseUrl,
    port,
    setWebhookUrl(url) {
      webhookUrl = url;
    },
    deliveries: () => [...deliveries.values()].map((d) => ({ ...d })),
    async idle() {
      for (let i = 0; i < 400 && [...deliveries.values()].some((d) => d.status === 'pending'); i++) {
        await new Promise((r) => setTimeout(r, 25));
      }
    },
    async close() {
      for (const t of timers) clearTimeout(t);
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
    },
  };
}
