/**
 * `npm run load`: the server under load on loopback (autocannon), with the invented demo data in a
 * throwaway PostgreSQL: 50 connections for 30 s (LOAD_SECONDS) each on reading a project, on a cached
 * sweep, and on the cached sweep again while fresh sweeps run in the worker pool. Prints p50, p95,
 * p99 and errors. A benchmark for the README, not a test.
 */
import { chmodSync, mkdtempSync, readdirSync, readFileSync, rmSync } from 'node:fs';
import { randomBytes } from 'node:crypto';
import { cpus, tmpdir } from 'node:os';
import path from 'node:path';
import autocannon from 'autocannon';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '../shared/api/csrf';
import { createDb } from '../server/db';
import { migrateLatest } from '../server/migrate';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, seedDemo } from '../server/seed/demo-seed';
import { ensurePostgresInstalled, PgCluster } from './pg-cluster';
import { freePort, startServerProcess } from './server-process';

const SECONDS = Number(process.env['LOAD_SECONDS'] ?? 30);
const CONNECTIONS = 50;
const WARM_UP_SECONDS = 5;

/** CPU seconds (user + system) used so far by the processes whose command name is `comm`, or by one pid. */
function cpuSeconds(which: { pid: number } | { comm: string }): number {
  const ticks = 100; // USER_HZ on Linux
  const pids = 'pid' in which ? [String(which.pid)] : readdirSync('/proc').filter((d) => /^\d+$/.test(d));
  let total = 0;
  for (const pid of pids) {
    try {
      const stat = readFileSync(`/proc/${pid}/stat`, 'utf8');
      const close = stat.lastIndexOf(')');
      if ('comm' in which && stat.slice(stat.indexOf('(') + 1, close) !== which.comm) continue;
      const fields = stat.slice(close + 2).split(' ');
      total += (Number(fields[11]) + Number(fields[12])) / ticks;
    } catch {
      // the process ended meanwhile
    }
  }
  return total;
}

const pct = (sorted: number[], p: number) =>
  sorted[Math.min(sorted.length - 1, Math.floor((p / 100) * sorted.length))] ?? NaN;

interface Figures {
  requests: number;
  errors: number;
  non2xx: number;
  p50: number;
  p95: number;
  p99: number;
}

/** A few seconds of the same load, not counted: the JIT compiles the hot paths and the pools fill. */
async function warmUp(opts: { url: string; method: 'GET' | 'POST'; headers: Record<string, string> }): Promise<void> {
  await new Promise<void>((resolve, reject) => {
    autocannon(
      {
        url: opts.url,
        method: opts.method,
        headers: opts.headers,
        connections: CONNECTIONS,
        duration: WARM_UP_SECONDS,
      },
      (err) => {
        if (err) reject(err instanceof Error ? err : new Error(String(err)));
        else resolve();
      },
    );
  });
}

async function run(
  title: string,
  opts: { url: string; method: 'GET' | 'POST'; headers: Record<string, string>; serverPid: number },
): Promise<Figures> {
  const times: number[] = [];
  const server0 = cpuSeconds({ pid: opts.serverPid });
  const db0 = cpuSeconds({ comm: 'postgres' });
  const result = await new Promise<autocannon.Result>((resolve, reject) => {
    const instance = autocannon(
      { url: opts.url, method: opts.method, headers: opts.headers, connections: CONNECTIONS, duration: SECONDS },
      (err, res) => {
        if (err) reject(err instanceof Error ? err : new Error(String(err)));
        else resolve(res);
      },
    );
    instance.on('response', (_client, _status, _bytes, ms) => times.push(ms));
  });
  const serverMs = ((cpuSeconds({ pid: opts.serverPid }) - server0) * 1000) / Math.max(1, result.requests.total);
  const dbMs = ((cpuSeconds({ comm: 'postgres' }) - db0) * 1000) / Math.max(1, result.requests.total);
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
  console.log(`${''.padEnd(46)} CPU per request: server ${serverMs.toFixed(2)} ms, PostgreSQL ${dbMs.toFixed(2)} ms`);
  return f;
}

async function main(): Promise<void> {
  const dir = mkdtempSync(path.join(tmpdir(), 'tailroom-load-'));
  chmodSync(dir, 0o755);
  const cluster = new PgCluster(
    path.join(dir, 'pg'),
    await freePort(),
    randomBytes(12).toString('hex'),
    ensurePostgresInstalled(console.log),
  );
  let stopServer: (() => Promise<void>) | null = null;
  try {
    cluster.init({ throwaway: true });
    cluster.start();
    await cluster.createDatabase('load');
    const databaseUrl = cluster.url('load');
    const db = createDb(databaseUrl);
    await migrateLatest(db);
    console.log('Seeding the invented demo data…');
    await seedDemo(db);
    await db.destroy();
    const profileDir = process.env['LOAD_CPU_PROF'];
    const server = await startServerProcess(
      cluster.localUrl('load'),
      profileDir ? ['--cpu-prof', `--cpu-prof-dir=${profileDir}`] : [],
    );
    stopServer = () => server.stop();
    const serverPid = server.pid;
    const base = server.base;

    const signIn = await fetch(`${base}/api/v1/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json' },
      body: JSON.stringify({ email: DEMO_ACCOUNTS[0].email, password: DEMO_PASSWORD }),
    });
    const cookie = (signIn.headers.get('set-cookie') ?? '').split(';')[0] ?? '';
    const headers = { cookie, [CSRF_HEADER]: CSRF_HEADER_VALUE, 'content-type': 'application/json' };
    const projects = (await (await fetch(`${base}/api/v1/projects`, { headers })).json()) as { id: string }[];
    const projectId = projects[0]?.id ?? '';
    const scenarios = (await (await fetch(`${base}/api/v1/projects/${projectId}/scenarios`, { headers })).json()) as {
      id: string;
      version: number;
      settings: Record<string, unknown>;
    }[];
    const scenario = scenarios[0];
    const other = scenarios[1];
    if (!scenario || !other) throw new Error('demo scenarios missing');
    const sweepUrl = `${base}/api/v1/projects/${projectId}/scenarios/${scenario.id}/sweep`;
    const t0 = performance.now();
    const first = await (await fetch(sweepUrl, { method: 'POST', headers })).text();
    console.log(
      `First sweep of the demo scenario (worker start, record load, sweep): ${(performance.now() - t0).toFixed(0)} ms`,
    );
    const projectBody = await (await fetch(`${base}/api/v1/projects/${projectId}`, { headers })).text();
    console.log(
      `Answer sizes: project ${(projectBody.length / 1024).toFixed(1)} kB, sweep ${(first.length / 1024).toFixed(1)} kB`,
    );
    console.log(
      `Machine: ${cpus().length} cores, Node ${process.version}; ${CONNECTIONS} connections, ${SECONDS} s each after ${WARM_UP_SECONDS} s of warm-up\n`,
    );
    await warmUp({ url: `${base}/api/v1/projects/${projectId}`, method: 'GET', headers });
    await warmUp({ url: sweepUrl, method: 'POST', headers });

    const read = await run('GET a project', {
      url: `${base}/api/v1/projects/${projectId}`,
      method: 'GET',
      headers,
      serverPid,
    });
    const cached = await run('POST a sweep (cached result)', { url: sweepUrl, method: 'POST', headers, serverPid });

    // Fresh sweeps in the background: another scenario's discount rate changes before each one, so every run is new.
    let stop = false;
    let fresh = 0;
    let freshMs = 0;
    const otherBase = `${base}/api/v1/projects/${projectId}/scenarios/${other.id}`;
    let version = other.version;
    const freshLoop = async () => {
      for (let rate = 0.01; !stop; rate += 0.01) {
        const patched = await fetch(otherBase, {
          method: 'PATCH',
          headers,
          body: JSON.stringify({
            version,
            settings: { ...other.settings, discountRatePct: Number((3 + rate).toFixed(2)) },
          }),
        });
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
    const during = await run('POST a sweep (cached) while fresh sweeps run', {
      url: sweepUrl,
      method: 'POST',
      headers,
      serverPid,
    });
    stop = true;
    await loop;
    console.log(
      `\nFresh sweeps completed meanwhile: ${fresh} (mean ${(freshMs / Math.max(1, fresh)).toFixed(0)} ms each, in the worker pool)`,
    );
    console.log(`Cached-sweep p95 with fresh sweeps running ÷ without: ${(during.p95 / cached.p95).toFixed(2)}×`);
    const ok = read.errors + cached.errors + during.errors === 0 && read.non2xx + cached.non2xx + during.non2xx === 0;
    console.log(
      `Targets: zero errors ${ok ? 'met' : 'NOT met'}; p95 of cached reads under 150 ms ${Math.max(read.p95, cached.p95) < 150 ? 'met' : 'NOT met'}; fresh sweeps slow cached reads by at most 2× ${during.p95 / cached.p95 <= 2 ? 'met' : 'NOT met'}`,
    );
  } finally {
    if (stopServer) await stopServer();
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
