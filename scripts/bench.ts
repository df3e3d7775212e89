/**
 * `npm run bench`: speed figures for the README, measured on this machine (not asserted in tests).
 * First the design-temperature sweep (fast path against the naive loop, scripts/bench-sweep.ts) and its
 * uncertainty band (300 Monte Carlo draws, scripts/bench-odds.ts); then
 * reading, checking and storing a 30-year hourly record (about 263,000 rows) the way an upload does,
 * against a throwaway PostgreSQL on loopback.
 */
import { chmodSync, mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import path from 'node:path';
import { randomBytes } from 'node:crypto';
import { createServer } from 'node:net';
import { DEMO_SITES, generateDemoSeries, seriesToCsv, seriesToIsdLite } from '../shared/climate/demo-weather';
import { createDb } from '../server/db';
import { migrateLatest } from '../server/migrate';
import { analyse, storeRecord, storedComputation } from '../server/modules/climate/climate-service';
import { atStoragePrecision } from '../server/modules/climate/series-codec';
import { readWeatherFiles } from '../server/modules/climate/weather-files';
import type { DesignConditions } from '../shared/climate/design-conditions-schema';
import { createSweepPool } from '../server/modules/scenarios/sweep-pool';
import type { SweepTask } from '../server/modules/scenarios/sweep-worker';
import { benchOdds } from './bench-odds';
import { benchScenarioInput, benchSweep } from './bench-sweep';
import { ensurePostgresInstalled, PgCluster } from './pg-cluster';

const RUNS = 5;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor(xs.length / 2)] ?? NaN;
const ms = (x: number) => `${x.toFixed(0)} ms`;

function freePort(): Promise<number> {
  return new Promise((resolve) => {
    const s = createServer();
    s.listen(0, '127.0.0.1', () => {
      const { port } = s.address() as { port: number };
      s.close(() => resolve(port));
    });
  });
}

async function main(): Promise<void> {
  benchSweep();
  benchOdds();
  console.log('');
  const dir = mkdtempSync(path.join(tmpdir(), 'tailroom-bench-'));
  chmodSync(dir, 0o755);
  const cluster = new PgCluster(path.join(dir, 'pg'), await freePort(), randomBytes(12).toString('hex'), ensurePostgresInstalled(console.log));
  try {
    cluster.init({ throwaway: false });
    cluster.start();
    await cluster.createDatabase('bench');
    const db = createDb(cluster.url('bench'));
    await migrateLatest(db);
    const [org] = await db('organizations').insert({ name: 'Bench (invented)' }).returning<{ id: string }[]>('id');
    const orgId = org?.id ?? '';
    const site = DEMO_SITES[0];
    if (!site) throw new Error('no demo site');
    const series = generateDemoSeries(site, { years: 30 });
    const files = {
      csv: Buffer.from(seriesToCsv(series)),
      'isd-lite': Buffer.from(seriesToIsdLite(series)),
    } as const;
    console.log(`Record: ${site.name}, 30 years, ${series.time.length} hourly rows; CSV ${(files.csv.length / 1e6).toFixed(1)} MB, ISD-Lite ${(files['isd-lite'].length / 1e6).toFixed(1)} MB`);
    console.log(`Machine: ${(await import('node:os')).cpus().length} cores, Node ${process.version}; median of ${RUNS} runs\n`);

    for (const format of ['csv', 'isd-lite'] as const) {
      const read: number[] = [];
      const check: number[] = [];
      const store: number[] = [];
      const total: number[] = [];
      for (let run = 0; run < RUNS; run++) {
        const [row] = await db('climate_sites')
          .insert({ organization_id: orgId, name: `bench ${format} ${run}`, source_kind: 'hourly', elevation_m: site.elevationM })
          .returning<{ id: string }[]>('id');
        const siteId = row?.id ?? '';
        const t0 = performance.now();
        const parsed = readWeatherFiles([{ name: `bench.${format}`, content: files[format] }], { format: 'auto' });
        const t1 = performance.now();
        const stored = atStoragePrecision(parsed.series);
        // The upload's quality report and preview, kept with the upload and reused at confirmation.
        const source = { fileName: 'bench', rowCount: parsed.rowCount };
        const computed = storedComputation(analyse(stored, site.elevationM), source);
        const t2 = performance.now();
        await db.transaction((trx) => storeRecord(trx, siteId, stored, site.elevationM, source, computed));
        const t3 = performance.now();
        read.push(t1 - t0);
        check.push(t2 - t1);
        store.push(t3 - t2);
        total.push(t3 - t0);
      }
      console.log(
        `${format.padEnd(8)} read ${ms(median(read))} · check + preview ${ms(median(check))} · store (COPY + save) ${ms(median(store))} · total ${ms(median(total))}`,
      );
    }

    // A sweep in the worker pool over a stored record: the first loads the record from PostgreSQL
    // and indexes it in the worker; later ones (other inputs, same record) reuse it.
    const [stored] = await db('design_conditions').select<{ climate_site_id: string; conditions: DesignConditions; computed_at: Date }[]>(
      'climate_site_id',
      'conditions',
      'computed_at',
    );
    if (stored) {
      const pool = createSweepPool({ maxThreads: 1 });
      const scenario = benchScenarioInput(stored.conditions);
      const task = (rate: number): SweepTask => ({
        databaseUrl: cluster.url('bench'),
        input: { ...scenario, economics: { discountRatePct: rate } },
        record: { siteId: stored.climate_site_id, key: `${stored.climate_site_id}@${stored.computed_at.toISOString()}`, qualifyingYears: stored.conditions.period.qualifyingYears },
        odds: { uncertainty: null },
      });
      let t = performance.now();
      await pool.run('cold', task(3));
      const cold = performance.now() - t;
      const warm: number[] = [];
      for (let run = 0; run < RUNS; run++) {
        t = performance.now();
        await pool.run(`warm-${run}`, task(4 + run));
        warm.push(performance.now() - t);
      }
      await pool.close();
      console.log(`\nWorker pool sweep of a stored 30-year record: first (load from PostgreSQL + index + sweep) ${ms(cold)} · later sweeps of the same record ${median(warm).toFixed(1)} ms`);
    }
    await db.destroy();
  } finally {
    cluster.stop('fast');
    rmSync(dir, { recursive: true, force: true });
  }
}

main().catch((err: unknown) => {
  console.error(err);
  process.exit(1);
});
