/**
 * `npm run bench`: speed figures for the README, measured on this machine (not asserted in tests).
 *
 * 1. The design-temperature sweep: fast path against the naive loop (scripts/bench-sweep.ts), and its
 *    uncertainty band: 300 Monte Carlo draws (scripts/bench-odds.ts).
 * 2. Uploading a 30-year hourly record (about 263,000 rows) as CSV and as ISD-Lite: read, checked and
 *    previewed in the upload pool, then stored (one row of columns with its sweep index).
 * 3. Sweeps in the worker pool over a stored record: the first of a record (load + sweep, the worker
 *    already warm as it is once the server has started) and later ones.
 * 4. `/api/health` under autocannon while the server (its own process) reads a 50 MB upload.
 * 5. The client's initial bundle, gzip-compressed (built first when there is no build).
 *
 * `npm run bench -- --json` ends with one JSON line of the medians in milliseconds;
 * `npm run bench -- --readme` also rewrites the README's performance table from it.
 */
import { spawnSync } from 'node:child_process';
import { chmodSync, existsSync, mkdtempSync, readFileSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import { gzipSync } from 'node:zlib';
import autocannon from 'autocannon';
import { CSRF_HEADER, CSRF_HEADER_VALUE } from '../shared/api/csrf';
import { DEMO_SITES, generateDemoSeries, seriesToCsv, seriesToIsdLite } from '../shared/climate/demo-weather';
import type { DesignConditions } from '../shared/climate/design-conditions-schema';
import { createDb } from '../server/db';
import { migrateLatest } from '../server/migrate';
import { storeRecord } from '../server/modules/climate/climate-service';
import { decodeSeries } from '../server/modules/climate/series-codec';
import { createUploadPool } from '../server/modules/climate/upload-pool';
import { createSweepPool } from '../server/modules/scenarios/sweep-pool';
import type { SweepTask } from '../server/modules/scenarios/sweep-worker';
import { DEMO_ACCOUNTS, DEMO_PASSWORD, seedDemo } from '../server/seed/demo-seed';
import { benchOdds } from './bench-odds';
import { benchScenarioInput, benchSweep } from './bench-sweep';
import { ensurePostgresInstalled, PgCluster } from './pg-cluster';
import { freePort, startServerProcess } from './server-process';

const RUNS = 5;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] ?? NaN;
const ms = (x: number) => `${x.toFixed(0)} ms`;
const round1 = (x: number) => Math.round(x * 10) / 10;

export interface BenchFigures {
  sweepFastMs: number;
  sweepNaiveMs: number;
  indexMs: number;
  /** The Monte Carlo of 300 draws over the 30-year record (wall time; CPU time beside it). */
  uncertaintyBandMs: number;
  uncertaintyBandCpuMs: number;
  uploadCsvMs: number;
  uploadIsdLiteMs: number;
  coldSweepMs: number;
  warmSweepMs: number;
  healthP95DuringUploadMs: number;
  initialBundleGzipKB: number;
  loadAverage1m: number;
  cores: number;
}

/** Uploads of a 30-year record through the upload pool and the store; the sites they made. */
async function benchUploads(databaseUrl: string): Promise<{ csv: number; isdLite: number; siteIds: string[] }> {
  const db = createDb(databaseUrl);
  const pool = createUploadPool({ max: 1, perOrganization: 1 });
  try {
    const [org] = await db('organizations').insert({ name: 'Bench (invented)' }).returning<{ id: string }[]>('id');
    const orgId = org?.id ?? '';
    const site = DEMO_SITES[0];
    if (!site) throw new Error('no demo site');
    const series = generateDemoSeries(site, { years: 30 });
    const files = { csv: Buffer.from(seriesToCsv(series)), 'isd-lite': Buffer.from(seriesToIsdLite(series)) } as const;
    console.log(
      `\nRecord: ${site.name}, 30 years, ${series.time.length} hourly rows; CSV ${(files.csv.length / 1e6).toFixed(1)} MB, ISD-Lite ${(files['isd-lite'].length / 1e6).toFixed(1)} MB`,
    );
    const totals: Record<string, number> = {};
    const siteIds: string[] = [];
    for (const format of ['csv', 'isd-lite'] as const) {
      const read: number[] = [];
      const store: number[] = [];
      const total: number[] = [];
      // One run more than counted: the first starts the worker's JIT, as an upload after a while of others would find it.
      for (let run = 0; run <= RUNS; run++) {
        const [row] = await db('climate_sites')
          .insert({
            organization_id: orgId,
            name: `bench ${format} ${run}`,
            source_kind: 'hourly',
            elevation_m: site.elevationM,
          })
          .returning<{ id: string }[]>('id');
        const siteId = row?.id ?? '';
        const content = Uint8Array.from(files[format]); // moved to the worker, so a fresh copy each time
        const t0 = performance.now();
        const parsed = await pool.parse(orgId, {
          files: [{ name: `bench.${format}`, content }],
          format: 'auto',
          elevationM: site.elevationM,
          fileName: 'bench',
        });
        if (!parsed.ok) throw new Error(parsed.message);
        const t1 = performance.now();
        const source = { fileName: 'bench', rowCount: parsed.rowCount };
        const stored = decodeSeries(
          Buffer.from(parsed.series.buffer, parsed.series.byteOffset, parsed.series.byteLength),
        );
        await db.transaction((trx) =>
          storeRecord(trx, siteId, stored, site.elevationM, source, parsed.computed, parsed.sweepIndex),
        );
        const t2 = performance.now();
        siteIds.push(siteId);
        if (run === 0) continue;
        read.push(t1 - t0);
        store.push(t2 - t1);
        total.push(t2 - t0);
      }
      totals[format] = median(total);
      console.log(
        `${format.padEnd(8)} read + check + preview + index (upload pool) ${ms(median(read))} · store (one row of columns + conditions) ${ms(median(store))} · total ${ms(median(total))}`,
      );
    }
    return { csv: totals['csv'] ?? NaN, isdLite: totals['isd-lite'] ?? NaN, siteIds };
  } finally {
    await pool.close();
    await db.destroy();
  }
}

/** Sweeps in the worker pool: the first of each stored record (worker warm, record not yet loaded), and later ones of one record. */
async function benchPoolSweeps(databaseUrl: string, siteIds: string[]): Promise<{ cold: number; warm: number }> {
  const db = createDb(databaseUrl);
  const pool = createSweepPool({ maxThreads: 1, databaseUrl });
  try {
    await pool.ready();
    const rows = await db('design_conditions')
      .whereIn('climate_site_id', siteIds)
      .select<{ climate_site_id: string; conditions: DesignConditions; computed_at: Date }[]>(
        'climate_site_id',
        'conditions',
        'computed_at',
      );
    const task = (r: (typeof rows)[number], rate: number): SweepTask => ({
      databaseUrl,
      input: { ...benchScenarioInput(r.conditions), economics: { discountRatePct: rate } },
      record: {
        siteId: r.climate_site_id,
        key: `${r.climate_site_id}@${r.computed_at.toISOString()}`,
        qualifyingYears: r.conditions.period.qualifyingYears,
      },
      odds: { uncertainty: null },
    });
    const cold: number[] = [];
    for (const [k, r] of rows.entries()) {
      const t = performance.now();
      await pool.run(`cold-${k}`, task(r, 3));
      if (k > 0) cold.push(performance.now() - t); // the first also compiles the sweep code in the worker
    }
    const first = rows[0];
    const warm: number[] = [];
    for (let run = 0; first && run < 2 * RUNS + 1; run++) {
      const t = performance.now();
      await pool.run(`warm-${run}`, task(first, 4 + run / 10));
      warm.push(performance.now() - t);
    }
    console.log(
      `\nWorker pool, stored 30-year record: first sweep of a record (one query for its stored index + sweep) ${ms(median(cold))} · later sweeps of it ${median(warm).toFixed(1)} ms`,
    );
    return { cold: median(cold), warm: median(warm) };
  } finally {
    await pool.close();
    await db.destroy();
  }
}

/** A CSV of about 50 MB (unpacked) of invented hourly weather, gzip-compressed as a user might send it. */
function bigUpload(): { gz: Buffer; unpackedMB: number } {
  const site = DEMO_SITES[0];
  if (!site) throw new Error('no demo site');
  let text = seriesToCsv(generateDemoSeries(site, { years: 30 }));
  const years = Math.min(200, Math.ceil((30 * 50e6) / text.length));
  text = seriesToCsv(generateDemoSeries(site, { years }));
  return { gz: gzipSync(Buffer.from(text)), unpackedMB: text.length / 1e6 };
}

/** p95 of /api/health (autocannon, 10 connections) while the server, in its own process, reads a 50 MB upload. */
async function benchHealthDuringUpload(databaseUrl: string): Promise<number> {
  const db = createDb(databaseUrl);
  await seedDemo(db);
  await db.destroy();
  const server = await startServerProcess(databaseUrl);
  try {
    const signIn = await fetch(`${server.base}/api/v1/auth/sign-in`, {
      method: 'POST',
      headers: { 'content-type': 'application/json', [CSRF_HEADER]: CSRF_HEADER_VALUE },
      body: JSON.stringify({ email: DEMO_ACCOUNTS[0].email, password: DEMO_PASSWORD }),
    });
    const cookie = (signIn.headers.get('set-cookie') ?? '').split(';')[0] ?? '';
    const headers = { cookie, [CSRF_HEADER]: CSRF_HEADER_VALUE };
    const site = await fetch(`${server.base}/api/v1/climate-sites`, {
      method: 'POST',
      headers: { ...headers, 'content-type': 'application/json' },
      body: JSON.stringify({ name: 'Bench upload (invented)', sourceKind: 'hourly' }),
    });
    const siteId = ((await site.json()) as { id: string }).id;
    const { gz, unpackedMB } = bigUpload();
    const times: number[] = [];
    let instance: autocannon.Instance | undefined;
    const done = new Promise<void>((resolve) => {
      instance = autocannon({ url: `${server.base}/api/health`, connections: 10, duration: 120 }, () => resolve());
      instance.on('response', (_c, _s, _b, t) => times.push(t));
    });
    await new Promise((r) => setTimeout(r, 500));
    const form = new FormData();
    form.append('files', new Blob([new Uint8Array(gz)]), 'big.csv.gz');
    const t0 = performance.now();
    const up = await fetch(`${server.base}/api/v1/climate-sites/${siteId}/uploads`, {
      method: 'POST',
      headers,
      body: form,
    });
    const uploadMs = performance.now() - t0;
    const status = up.status;
    await up.arrayBuffer();
    instance?.stop();
    await done;
    times.sort((a, b) => a - b);
    const p95 = times[Math.min(times.length - 1, Math.floor(0.95 * times.length))] ?? NaN;
    console.log(
      `\n/api/health while a ${unpackedMB.toFixed(0)} MB upload (${(gz.length / 1e6).toFixed(1)} MB gzip) was read (${ms(uploadMs)}, answered ${status}): ${times.length} requests, p50 ${(times[Math.floor(times.length / 2)] ?? NaN).toFixed(1)} ms, p95 ${p95.toFixed(1)} ms`,
    );
    return p95;
  } finally {
    await server.stop();
  }
}

/** The gzip size of what index.html loads at start (scripts, module preloads and styles), kB. */
function initialBundleGzipKB(): number {
  const dist = path.join('dist', 'tailroom', 'browser');
  if (!existsSync(path.join(dist, 'index.html'))) {
    console.log('\nBuilding the client (no build found)…');
    const built = spawnSync('npx', ['ng', 'build'], { stdio: 'inherit' });
    if (built.status !== 0) throw new Error('ng build failed');
  }
  const html = readFileSync(path.join(dist, 'index.html'), 'utf8');
  const files = new Set([...html.matchAll(/(?:src|href)="([^"]+\.(?:js|css))"/g)].map((m) => m[1] ?? ''));
  let bytes = 0;
  for (const f of files) bytes += gzipSync(readFileSync(path.join(dist, f)), { level: 9 }).length;
  const kb = bytes / 1024;
  console.log(`\nInitial bundle (${files.size} files loaded by index.html), gzip: ${kb.toFixed(1)} kB`);
  return kb;
}

const README_START = '<!-- bench:start (npm run bench -- --readme) -->';
const README_END = '<!-- bench:end -->';

/** The README's performance table, from the figures. */
export function readmeTable(f: BenchFigures, date: string): string {
  const row = (step: string, value: string, target: string, met: boolean) =>
    `| ${step} | ${value} | ${target} | ${met ? 'met' : 'not met'} |`;
  return [
    README_START,
    `Measured ${date} on ${f.cores} cores with a load average of ${f.loadAverage1m.toFixed(2)} (1 min) at the start:`,
    '',
    '| step | median | target | |',
    '|---|---|---|---|',
    row(
      'first sweep of a stored 30-year record (warm worker, one query for the stored index, sweep)',
      `${f.coldSweepMs.toFixed(0)} ms`,
      '≤ 300 ms',
      f.coldSweepMs <= 300,
    ),
    row('later sweeps of the same record', `${f.warmSweepMs.toFixed(1)} ms`, '≤ 10 ms', f.warmSweepMs <= 10),
    row(
      '30-year upload, CSV: read + check + store',
      `${f.uploadCsvMs.toFixed(0)} ms`,
      '≤ 1,000 ms',
      f.uploadCsvMs <= 1000,
    ),
    row(
      '30-year upload, ISD-Lite: read + check + store',
      `${f.uploadIsdLiteMs.toFixed(0)} ms`,
      '≤ 1,000 ms',
      f.uploadIsdLiteMs <= 1000,
    ),
    row(
      '`/api/health` p95 while a 50 MB upload is read',
      `${f.healthP95DuringUploadMs.toFixed(1)} ms`,
      '≤ 100 ms',
      f.healthP95DuringUploadMs <= 100,
    ),
    row(
      'sweep, naive loop ÷ fast path',
      `${f.sweepNaiveMs.toFixed(0)} ms ÷ ${f.sweepFastMs.toFixed(1)} ms = ${(f.sweepNaiveMs / f.sweepFastMs).toFixed(0)}×`,
      '≥ 100×',
      f.sweepNaiveMs / f.sweepFastMs >= 100,
    ),
    row('indexing a 30-year record (at upload)', `${f.indexMs.toFixed(0)} ms`, '', true),
    row(
      'uncertainty band: 300 Monte Carlo draws over a 30-year record (CPU time beside)',
      `${f.uncertaintyBandMs.toFixed(0)} ms (${f.uncertaintyBandCpuMs.toFixed(0)} ms CPU)`,
      '< 1,000 ms',
      f.uncertaintyBandMs < 1000,
    ),
    row(
      'initial client bundle, gzip',
      `${f.initialBundleGzipKB.toFixed(0)} kB`,
      '< 300 kB',
      f.initialBundleGzipKB < 300,
    ),
    README_END,
  ].join('\n');
}

async function main(): Promise<void> {
  const asJson = process.argv.includes('--json');
  const toReadme = process.argv.includes('--readme');
  const loadAverage1m = loadavg()[0] ?? NaN;
  console.log(
    `Machine: ${cpus().length} cores, Node ${process.version}, load average ${loadavg()
      .map((x) => x.toFixed(2))
      .join(' ')}\n`,
  );
  const sweep = benchSweep();
  const band = benchOdds();
  const dir = mkdtempSync(path.join(tmpdir(), 'tailroom-bench-'));
  chmodSync(dir, 0o755);
  const cluster = new PgCluster(
    path.join(dir, 'pg'),
    await freePort(),
    randomBytes(12).toString('hex'),
    ensurePostgresInstalled(console.log),
  );
  let figures: BenchFigures;
  try {
    cluster.init({ throwaway: false });
    cluster.start();
    await cluster.createDatabase('bench');
    const databaseUrl = cluster.url('bench');
    const db = createDb(databaseUrl);
    await migrateLatest(db);
    await db.destroy();
    const uploads = await benchUploads(databaseUrl);
    const sweeps = await benchPoolSweeps(databaseUrl, uploads.siteIds);
    const health = await benchHealthDuringUpload(cluster.localUrl('bench'));
    figures = {
      sweepFastMs: round1(sweep.fastMs),
      sweepNaiveMs: round1(sweep.naiveMs),
      indexMs: round1(sweep.indexMs),
      uncertaintyBandMs: round1(band.monteCarloMs),
      uncertaintyBandCpuMs: round1(band.monteCarloCpuMs),
      uploadCsvMs: round1(uploads.csv),
      uploadIsdLiteMs: round1(uploads.isdLite),
      coldSweepMs: round1(sweeps.cold),
      warmSweepMs: round1(sweeps.warm),
      healthP95DuringUploadMs: round1(health),
      initialBundleGzipKB: round1(initialBundleGzipKB()),
      loadAverage1m: Math.round(loadAverage1m * 100) / 100,
      cores: cpus().length,
    };
  } finally {
    cluster.stop('fast');
    rmSync(dir, { recursive: true, force: true });
  }
  if (toReadme) {
    const readme = readFileSync('README.md', 'utf8');
    const a = readme.indexOf(README_START);
    const b = readme.indexOf(README_END);
    if (a < 0 || b < a) throw new Error('README.md has no bench table markers');
    writeFileSync(
      'README.md',
      readme.slice(0, a) +
        readmeTable(figures, new Date().toISOString().slice(0, 16).replace('T', ' ') + ' UTC') +
        readme.slice(b + README_END.length),
    );
    console.log('\nREADME.md performance table rewritten');
  }
  if (asJson) console.log(JSON.stringify(figures));
}

main().then(
  () => process.exit(0),
  (err: unknown) => {
    console.error(err);
    process.exit(1);
  },
);
