import { mkdirSync, readFileSync, renameSync } from 'node:fs';
import { createServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import path from 'node:path';
import { chromium, type Browser, type Page } from 'playwright-core';
import { createApp } from '../../server/app';
import { FAKE_STRIPE_SECRET_KEY, FAKE_STRIPE_WEBHOOK_SECRET, parseConfig } from '../../server/config';
import { startPaymentFake, type PaymentFake } from '../../server/fakes/payment-fake';
import { createDb } from '../../server/db';
import { createLogger } from '../../server/logger';
import { createMailer } from '../../server/mail/mailer';
import { startSmtpSink, type SmtpSink } from '../../server/fakes/smtp-sink';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, seedDemo } from '../../server/seed/demo-seed';
import type { Role } from '../../shared/auth/roles';

export const SCREENSHOTS = path.resolve('test-results/screenshots');

export interface E2eApp {
  baseUrl: string;
  sink: SmtpSink;
  /** The local fake of the payment provider the app's SDK talks to. */
  payments: PaymentFake;
  browser: Browser;
  close(): Promise<void>;
}

/** Opens the Dev outbox without signing in (`/dev/outbox?token=…`). */
export const E2E_OUTBOX_TOKEN = 'e2e-dev-outbox-token-0123456789';

/** The real server (built client, test database, local e-mail sink) on a free loopback port, and Chromium. */
export async function startE2eApp(): Promise<E2eApp> {
  const databaseUrl = process.env['DATABASE_URL'];
  const clientDist = process.env['CLIENT_DIST'];
  if (!databaseUrl || !clientDist) throw new Error('DATABASE_URL and CLIENT_DIST are set by `npm test`');
  const sink = await startSmtpSink();
  const payments = await startPaymentFake({
    secretKey: FAKE_STRIPE_SECRET_KEY,
    webhookSecret: FAKE_STRIPE_WEBHOOK_SECRET,
    retryBaseMs: 200,
  });
  const base = {
    STRIPE_API_HOST: '127.0.0.1',
    STRIPE_API_PORT: String(payments.port),
    STRIPE_API_PROTOCOL: 'http',
    NODE_ENV: 'test',
    DATABASE_URL: databaseUrl,
    SESSION_SECRET: 'e2e-session-secret-that-is-long-enough-000',
    SMTP_PORT: String(sink.smtpPort),
    DEV_OUTBOX_URL: `http://127.0.0.1:${sink.httpPort}`,
    DEV_OUTBOX_TOKEN: E2E_OUTBOX_TOKEN,
    CLIENT_DIST: clientDist,
    LOG_LEVEL: 'silent',
  };
  // The public URL (used in e-mailed links) is known only once the port is: listen first, then attach the app.
  const server = createServer();
  await new Promise<void>((resolve) => server.listen(0, '127.0.0.1', resolve));
  const port = (server.address() as AddressInfo).port;
  const config = parseConfig({ ...base, PORT: String(port), PUBLIC_URL: `http://127.0.0.1:${port}` });
  const db = createDb(databaseUrl);
  const mailer = createMailer(config);
  const app = createApp({ config, db, mailer, logger: createLogger('silent') });
  server.on('request', app.app);
  payments.setWebhookUrl(`http://127.0.0.1:${port}/api/v1/billing/webhook`);

  const browser = await chromium.launch({
    executablePath: '/usr/bin/chromium',
    headless: true,
    args: [
      '--no-sandbox',
      '--disable-gpu',
      '--disable-dev-shm-usage',
      '--disable-background-networking',
      '--disable-component-update',
      '--disable-sync',
      '--no-first-run',
      '--disable-quic',
    ],
  });
  mkdirSync(SCREENSHOTS, { recursive: true });
  return {
    baseUrl: `http://127.0.0.1:${port}`,
    sink,
    payments,
    browser,
    async close() {
      await browser.close();
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await app.close();
      mailer.close();
      await db.destroy();
      await sink.close();
      await payments.close();
    },
  };
}

/**
 * Fails the test when the page asks anything of a host other than the app itself, or when the
 * browser reports a content-security-policy violation (recorded as `csp: …`): any
 * `securitypolicyviolation` event at all, even one the page's code caught (such as a probe for eval).
 */
export function guardOffline(page: Page, baseUrl: string, offenders: string[]): void {
  // A string, not a function: the test runner's transpiler would wrap a function's inner helpers.
  void page.addInitScript(`document.addEventListener('securitypolicyviolation', (e) => {
    console.error('Content Security Policy violation event: ' + e.violatedDirective + ' blocked ' + (e.blockedURI || 'inline') + ' at ' + e.sourceFile + ':' + e.lineNumber);
  });`);
  page.on('console', (msg) => {
    if (msg.type() === 'error' && /Content Security Policy/i.test(msg.text())) offenders.push(`csp: ${msg.text()}`);
  });
  page.on('request', (req) => {
    const url = req.url();
    if (!url.startsWith(baseUrl) && !url.startsWith('data:') && !url.startsWith('blob:')) offenders.push(url);
  });
}

export async function screenshot(page: Page, name: string): Promise<void> {
  await page.evaluate(() => {
    window.scrollTo(0, 0);
  });
  await page.screenshot({ path: path.join(SCREENSHOTS, `${name}.png`), fullPage: true });
}

/**
 * Draws every page of a PDF with PDF.js (from node_modules, handed to the page as blob URLs, so
 * nothing is fetched) and saves a screenshot of each (`<name>-1.png`, …), to look at what a PDF
 * download holds. Answers the number of pages.
 */
export async function pdfPageScreenshots(browser: Browser, pdf: Buffer, name: string): Promise<number> {
  const dir = path.resolve('node_modules/pdfjs-dist/legacy/build');
  const lib = readFileSync(path.join(dir, 'pdf.min.mjs'), 'utf8');
  const worker = readFileSync(path.join(dir, 'pdf.worker.min.mjs'), 'utf8');
  const context = await browser.newContext({ viewport: { width: 900, height: 1200 } });
  const page = await context.newPage();
  await page.setContent('<!doctype html><body style="margin:0;background:#888"></body>');
  // A string, not a function: the test runner's transpiler would wrap a function's inner helpers.
  const pages = await page.evaluate<number>(`(async () => {
    const url = (code) => URL.createObjectURL(new Blob([code], { type: 'text/javascript' }));
    const pdfjs = await import(url(${JSON.stringify(lib)}));
    pdfjs.GlobalWorkerOptions.workerSrc = url(${JSON.stringify(worker)});
    const bytes = Uint8Array.from(atob('${pdf.toString('base64')}'), (c) => c.charCodeAt(0));
    const doc = await pdfjs.getDocument({ data: bytes }).promise;
    for (let n = 1; n <= doc.numPages; n++) {
      const p = await doc.getPage(n);
      const viewport = p.getViewport({ scale: 1.4 });
      const canvas = document.createElement('canvas');
      canvas.id = 'page-' + n;
      canvas.style.display = 'block';
      canvas.style.marginBottom = '8px';
      canvas.width = viewport.width;
      canvas.height = viewport.height;
      document.body.appendChild(canvas);
      await p.render({ canvasContext: canvas.getContext('2d'), viewport }).promise;
    }
    return doc.numPages;
  })()`);
  for (let n = 1; n <= pages; n++)
    await page.locator(`#page-${n}`).screenshot({ path: path.join(SCREENSHOTS, `${name}-${n}.png`) });
  await context.close();
  return pages;
}

/** The first page of a PDF as `<name>.png` (the other pages are drawn too, as `<name>-2.png`, …). */
export async function pdfFirstPageScreenshot(browser: Browser, pdf: Buffer, name: string): Promise<void> {
  await pdfPageScreenshots(browser, pdf, name);
  renameSync(path.join(SCREENSHOTS, `${name}-1.png`), path.join(SCREENSHOTS, `${name}.png`));
}

/** Seeds the invented demo organisation into the test database (once; a second call changes nothing). */
export async function seedDemoData(): Promise<void> {
  const db = createDb(process.env['DATABASE_URL'] ?? '');
  try {
    await seedDemo(db);
  } finally {
    await db.destroy();
  }
}

/** Signs in as the demo account with `role` and waits for the projects page. */
export async function signInAsDemo(page: Page, baseUrl: string, role: Role): Promise<void> {
  const account = DEMO_ACCOUNTS.find((a) => a.role === role) ?? DEMO_ACCOUNTS[0];
  await page.goto(baseUrl + '/sign-in');
  await page.getByLabel(/^E-mail/).fill(account.email);
  await page.getByLabel(/^Password/).fill(DEMO_PASSWORD);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.waitForURL(/\/projects$/);
}
