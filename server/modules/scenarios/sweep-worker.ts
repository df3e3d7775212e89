/**
 * Worker thread of the sweep pool (piscina): loads a site's hourly record once, keeps it indexed for
 * the next sweeps of that record, and runs the sweep off the request thread.
 */
import type { Knex } from 'knex';
import { loadDuration, indexSweepRecord, type LoadDurationPoint, type SweepInput, type SweepRecordIndex } from '@shared/sweep/sweep';
import { sweepWithOdds, type SweepOddsOptions, type SweepWithOdds } from '@shared/sweep/sweep-odds';
import { createDb } from '../../db';
import { loadObservations } from '../climate/climate-repo';

export interface SweepTaskRecord {
  siteId: string;
  /** Changes whenever the site's record or its computation changes. */
  key: string;
  qualifyingYears: number[];
}

export interface SweepTask {
  databaseUrl: string;
  input: Omit<SweepInput, 'record'>;
  record: SweepTaskRecord | null;
  /** The Monte Carlo of the uncertainty band and the period of the odds. */
  odds: SweepOddsOptions;
}

export interface SweepTaskResult {
  result: SweepWithOdds;
  loadDuration: LoadDurationPoint[] | null;
}

const KEEP_RECORDS = 4;
let db: Knex | null = null;
let dbUrl = '';
const records = new Map<string, Promise<SweepRecordIndex>>();

function database(url: string): Knex {
  if (db === null || dbUrl !== url) {
    void db?.destroy();
    db = createDb(url, 2);
    dbUrl = url;
  }
  return db;
}

function indexedRecord(url: string, record: SweepTaskRecord): Promise<SweepRecordIndex> {
  const key = `${record.key}|${record.qualifyingYears.join(',')}`;
  let entry = records.get(key);
  if (entry === undefined) {
    entry = loadObservations(database(url), record.siteId).then((series) =>
      indexSweepRecord({ series, qualifyingYears: record.qualifyingYears }),
    );
    entry.catch(() => records.delete(key));
    records.set(key, entry);
    while (records.size > KEEP_RECORDS) {
      const oldest = records.keys().next().value;
      if (oldest === undefined) break;
      records.delete(oldest);
    }
  } else {
    // Most recently used last.
    records.delete(key);
    records.set(key, entry);
  }
  return entry;
}

export default async function runSweepTask(task: SweepTask): Promise<SweepTaskResult> {
  const index = task.record ? await indexedRecord(task.databaseUrl, task.record) : null;
  const result = sweepWithOdds({ ...task.input, record: index }, task.odds);
  return {
    result,
    loadDuration: index ? loadDuration(task.input.building, index, task.input.designWindMs) : null,
  };
}
