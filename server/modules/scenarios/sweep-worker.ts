/**
 * Worker thread of the sweep pool (piscina): loads a site's record once — its sweep index as stored
 * at upload, in one query — keeps it for the next sweeps of that record, and runs the sweep off the
 * request thread. A warm-up task opens the database connection before the first sweep asks for it.
 */
import type { Knex } from 'knex';
import { loadDuration, sweep, type LoadDurationPoint, type SweepInput, type SweepRecordIndex, type SweepResult } from '@shared/sweep/sweep';
import { createDb } from '../../db';
import { buildSweepIndex, sweepIndexKey, unpackSweepIndex } from '@shared/sweep/sweep-index';
import { loadRecordForSweep } from '../climate/climate-repo';

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
}

/** Sent once when the pool starts: opens the worker's connection so that the first sweep finds it ready. */
export interface WarmUpTask {
  warmUp: true;
  databaseUrl: string;
}

export interface SweepTaskResult {
  result: SweepResult;
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
    entry = loadIndex(url, record);
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

async function loadIndex(url: string, record: SweepTaskRecord): Promise<SweepRecordIndex> {
  const stored = await loadRecordForSweep(database(url), record.siteId, sweepIndexKey(record.qualifyingYears));
  if (stored === undefined) throw new Error(`climate site ${record.siteId} has no stored record`);
  if ('index' in stored) return unpackSweepIndex(stored.index);
  // Stored before its index was kept, or with another index format: build it here.
  return buildSweepIndex({ series: stored.series, qualifyingYears: record.qualifyingYears });
}

export default async function runSweepTask(task: SweepTask | WarmUpTask): Promise<SweepTaskResult | null> {
  if ('warmUp' in task) {
    await database(task.databaseUrl).raw('select 1');
    return null;
  }
  const index = task.record ? await indexedRecord(task.databaseUrl, task.record) : null;
  const result = sweep({ ...task.input, record: index });
  return {
    result,
    loadDuration: index ? loadDuration(task.input.building, index, task.input.designWindMs) : null,
  };
}
