/**
 * Worker thread of the sweep pool (piscina): loads a site's record once — its sweep index as stored
 * at upload, in one query — keeps it for the next sweeps of that record, and runs the sweep off the
 * request thread. A warm-up task opens the database connection before the first sweep asks for it
 * and runs a few sweeps of an invented record, so that the first real ones find the code compiled.
 */
import type { Knex } from 'knex';
import { computeDesignConditions } from '@shared/climate/design-conditions';
import { seriesFromYear } from '@shared/climate/record-window';
import {
  loadDuration,
  type LoadDurationPoint,
  type SweepDesignValues,
  type SweepInput,
  type SweepRecordIndex,
} from '@shared/sweep/sweep';
import { sweepWithOdds, type SweepOddsOptions, type SweepWithOdds } from '@shared/sweep/sweep-odds';
import { createDb } from '../../db';
import { buildSweepIndex, sweepIndexKey, unpackSweepIndex } from '@shared/sweep/sweep-index';
import { loadRecord, loadRecordForSweep } from '../climate/climate-repo';
import { warmUpSweeps } from './sweep-warm-up';

export interface SweepTaskRecord {
  siteId: string;
  /** Changes whenever the site's record or its computation changes. */
  key: string;
  qualifyingYears: number[];
  /** The qualifying years are a recent-years window whose design values replace the whole record's (docs/methods.md#recent-years). */
  windowDesignValues?: boolean;
}

interface LoadedRecord {
  index: SweepRecordIndex;
  /** The design values of the window, when asked for. */
  windowDesign: SweepDesignValues | null;
}

export interface SweepTask {
  databaseUrl: string;
  input: Omit<SweepInput, 'record'>;
  record: SweepTaskRecord | null;
  /** The Monte Carlo of the uncertainty band and the period of the odds. */
  odds: SweepOddsOptions;
}

/** Sent once when the pool starts: opens the worker's connection so that the first sweep finds it ready. */
export interface WarmUpTask {
  warmUp: true;
  databaseUrl: string;
}

export interface SweepTaskResult {
  result: SweepWithOdds;
  loadDuration: LoadDurationPoint[] | null;
}

const KEEP_RECORDS = 4;
let db: Knex | null = null;
let dbUrl = '';
const records = new Map<string, Promise<LoadedRecord>>();

function database(url: string): Knex {
  if (db === null || dbUrl !== url) {
    void db?.destroy();
    db = createDb(url, 2);
    dbUrl = url;
  }
  return db;
}

function indexedRecord(url: string, record: SweepTaskRecord): Promise<LoadedRecord> {
  const key = `${record.key}|${record.qualifyingYears.join(',')}|${record.windowDesignValues ? 'w' : ''}`;
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

async function loadIndex(url: string, record: SweepTaskRecord): Promise<LoadedRecord> {
  if (record.windowDesignValues) {
    // A window of the latest years: its design values come from those years' hours (docs/methods.md#recent-years).
    const series = await loadRecord(database(url), record.siteId);
    const from = record.qualifyingYears[0];
    const window = from !== undefined ? computeDesignConditions(seriesFromYear(series, from)) : null;
    return {
      index: buildSweepIndex({ series, qualifyingYears: record.qualifyingYears }),
      windowDesign: window?.ok
        ? { heating: window.conditions.heating, extremeMin: window.conditions.extremeMin }
        : null,
    };
  }
  const stored = await loadRecordForSweep(database(url), record.siteId, sweepIndexKey(record.qualifyingYears));
  if (stored === undefined) throw new Error(`climate site ${record.siteId} has no stored record`);
  if ('index' in stored) return { index: unpackSweepIndex(stored.index), windowDesign: null };
  // Stored before its index was kept, or with another index format: build it here.
  return {
    index: buildSweepIndex({ series: stored.series, qualifyingYears: record.qualifyingYears }),
    windowDesign: null,
  };
}

export default async function runSweepTask(task: SweepTask | WarmUpTask): Promise<SweepTaskResult | null> {
  if ('warmUp' in task) {
    await database(task.databaseUrl).raw('select 1');
    warmUpSweeps();
    return null;
  }
  const loaded = task.record ? await indexedRecord(task.databaseUrl, task.record) : null;
  const index = loaded?.index ?? null;
  const designConditions = loaded?.windowDesign ?? task.input.designConditions;
  const result = sweepWithOdds({ ...task.input, designConditions, record: index }, task.odds);
  return {
    result,
    loadDuration: index ? loadDuration(task.input.building, index, task.input.designWindMs) : null,
  };
}
