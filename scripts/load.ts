/**
 * `npm run load`: the server under load on loopback (autocannon), with the invented demo data in a
 * throwaway PostgreSQL: 50 connections for 30 s (LOAD_SECONDS) each on reading a project, on a cached
 * sweep, and on the cached sweep again while fresh sweeps run in the worker pool. Prints p50, p95,
 * p99 and errors. A benchmark for the README, not a test.
 */
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { createServer as createHttpServer } from 'node:http';
import type { AddressInfo } from 'node:net';
import { randomBytes } from 'node:crypto';
import { cpus, tmpdir } from 'node:os';
import path from 'node:path';
import autocannon from 'autocannon';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '../shared/api/csrf';
import { createApp } from '../server/app';
import { parseConfig } from '../server/config';
import { createDb } from '../server/db';
import { createLogger } from '../server/logger';
import { createMailer } from '../server/mail/mailer';
import { migrateLatest } from '../server/migrate';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, seedDemo } from '../server/seed/demo-seed';
import { ensurePostgresInstalled, PgCluster } from './pg-cluster';

const SECONDS = Number(process.env['LOAD_SECONDS'] ?? 30);
const CONNECTIONS = 50;

function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createHttpServer();
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as AddressInfo;
      s.close(() => resolve(port));
    });
  });
}

const pct = (sorted: number[], p: number) => sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? NaN;

interface Figures {
  requests: number;
  errors: number;
  non2xx: number;
  p50: number;
  p95: number;
  p99: number;
}

async function run(title: string, opts: { url: string; method: 'GET' | 'POST'; headers: Record<string, string> }): Promise<Figures> {
  const times: number[] = [];
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon({ url: opts.url, method: opts.method, headers: opts.headers, connections: CONNECTIONS, duration: SECONDS }, (err, res) => {
      if (err) reject(err instanceof Error ? err : new Error(String(err)));
      else resolve(res);
    });
    instance.on('response', (_client, _status, _bytes, ms) => times.push(ms));
  });
  times.sort((a, b) => a - b);
  const f: Figures = {
    requests: result.requests.total,
    errors: result.errors + result.timeouts,
    non2xx: result.non2xx,
    p50: pct(times, 50),
    p95: pct(times, 95),
    p99: pct(times, 99),
  };
  console.log(
    `${title.padEnd(46)} ${String(f.requests).padStart(7)} req · p50 ${f.p50.toFixed(1)} ms · p95 ${f.p95.toFixed(1)} ms · p99 ${f.p99.toFixed(1)} ms · errors ${f.errors} · non-2xx ${f.non2xx}`,
  );
  return f;
}

async function main(): Promise<void> {
  const dir = mkdtempSync(path.join(tmpdir(), 'tailroom-load-'));
  chmodSync(dir, 0o755);
  const cluster = new PgCluster(path.join(dir, 'pg'), await freePort(), randomBytes(12).toString('hex'), ensurePostgresInstalled(console.log));
  let close: (() => Promise<void>) | null = null;
  try {
    cluster.init({ throwaway: true });
    cluster.start();
    await cluster.createDatabase('load');
    const databaseUrl = cluster.url('load');
    const db = createDb(databaseUrl);
    await migrateLatest(db);
    console.log('Seeding the invented demo data…');
    await seedDemo(db);
    const port = await freePort();
    const config = parseConfig({
      NODE_ENV: 'test',
      DATABASE_URL: databaseUrl,
      SESSION_SECRET: randomBytes(32).toString('hex'),
      PORT: String(port),
      LOG_LEVEL: 'silent',
    });
    const mailer = createMailer(config);
    const app = createApp({ config, db, mailer, logger: createLogger('silent') });
    const server = createHttpServer(app.app);
    await new Promise<void>((resolve) => server.listen(port, '127.0.0.1', resolve));
    close = async () => {
      server.closeAllConnections();
      await new Promise<void>((resolve) => server.close(() => resolve()));
      await app.close();
      mailer.close();
      await db.destroy();
    };
    const base = `http://127.0.0.1:${port}`;

    const signIn = await fetch(`${base}/api/v1/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: DEMO_ACCOUNTS[0].email, password: DEMO_PASSWORD }),
    });
    const cookie = (signIn.headers.get('set-cookie') ?? '').split(';')[0] ?? '';
    const headers = { cookie, [CSRF_HEADER]: CSRF_HEADER_VALUE, 'content-type': 'application/json' };
    const projects = (await (await fetch(`${base}/api/v1/projects`, { headers })).json()) as { id: string }[];
    const projectId = projects[0]?.id ?? '';
    const scenarios = (await (await fetch(`${base}/api/v1/projects/${projectId}/scenarios`, { headers })).json()) as { id: string; version: number; settings: Record<string, unknown> }[];
    const scenario = scenarios[0];
    const other = scenarios[1];
    if (!scenario || !other) throw new Error('demo scenarios missing');
    const sweepUrl = `${base}/api/v1/projects/${projectId}/scenarios/${scenario.id}/sweep`;
    const t0 = performance.now();
    await fetch(sweepUrl, { method: 'POST', headers });
    console.log(`First sweep of the demo scenario (worker start, record load, sweep): ${(performance.now() - t0).toFixed(0)} ms`);
    console.log(`Machine: ${cpus().length} cores, Node ${process.version}; ${CONNECTIONS} connections, ${SECONDS} s each\n`);

    const read = await run('GET a project', { url: `${base}/api/v1/projects/${projectId}`, method: 'GET', headers });
    const cached = await run('POST a sweep (cached result)', { url: sweepUrl, method: 'POST', headers });

    // Fresh sweeps in the background: another scenario's discount rate changes before each one, so every run is new.
    let stop = false;
    let fresh = 0;
    let freshMs = 0;
    const otherBase = `${base}/api/v1/projects/${projectId}/scenarios/${other.id}`;
    let version = other.version;
    const freshLoop = async () => {
      for (let rate = 0.01; !stop; rate += 0.01) {
        const patched = await fetch(otherBase, { method: 'PATCH', headers, body: JSON.stringify({ version, settings: { ...other.settings, discountRatePct: Number((3 + rate).toFixed(2)) } }) });
        if (patched.ok) version = ((await patched.json()) as { version: number }).version;
        const t = performance.now();
        const r = await fetch(`${otherBase}/sweep`, { method: 'POST', headers });
        await r.arrayBuffer();
        if (r.ok) {
          fresh++;
          freshMs += performance.now() - t;
        }
      }
    };
    const loop = freshLoop();
    const during = await run('POST a sweep (cached) while fresh sweeps run', { url: sweepUrl, method: 'POST', headers });
    stop = true;
    await loop;
    console.log(`\nFresh sweeps completed meanwhile: ${fresh} (mean ${(freshMs / Math.max(1, fresh)).toFixed(0)} ms each, in the worker pool)`);
    console.log(`Cached-sweep p95 with fresh sweeps running ÷ without: ${(during.p95 / cached.p95).toFixed(2)}×`);
    const ok = read.errors + cached.errors + during.errors === 0 && read.non2xx + cached.non2xx + during.non2xx === 0;
    console.log(`Targets: zero errors ${ok ? 'met' : 'NOT met'}; p95 of cached reads under 150 ms ${Math.max(read.p95, cached.p95) < 150 ? 'met' : 'NOT met'}; fresh sweeps slow cached reads by at most 2× ${during.p95 / cached.p95 <= 2 ? 'met' : 'NOT met'}`);
  } finally {
    if (close) await close();
    cluster.stop('fast');
    rmSync(dir, { recursive: true, force: true });
  }
}

main().then(
  () => process.exit(0),
  (err: unknown) => {
    console.error(err);
    process.exit(1);
  },
);
