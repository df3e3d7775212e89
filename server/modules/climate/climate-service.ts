import type { Knex } from 'knex';
import type { QualitySummary } from '@shared/climate-sites/climate-site-schemas';
import { computeFromPrepared, type DesignConditionsResult } from '@shared/climate/design-conditions';
import { METHOD_VERSION } from '@shared/climate/design-conditions-schema';
import type { HourlySeries } from '@shared/climate/hourly-series';
import { prepareSeries } from '@shared/climate/prepared-series';
import { qualityReportFromPrepared, type QualityReport } from '@shared/climate/quality-report';
import { buildSweepIndex, packSweepIndex, sweepIndexKey } from '@shared/sweep/sweep-index';
import { HttpError } from '../../http/http-error';
import * as repo from './climate-repo';

export interface Analysis {
  result: DesignConditionsResult;
  quality: QualityReport;
}

/** Checks and computes a record once (ordering, de-duplication and range checks shared by both). */
export function analyse(series: HourlySeries, elevationM: number | null): Analysis {
  const prepared = prepareSeries(series);
  return {
    result: computeFromPrepared(prepared, { elevationM }),
    quality: qualityReportFromPrepared(prepared),
  };
}

/** The quality report without its chart data, as the upload screen shows it. */
export function qualitySummary(q: QualityReport): QualitySummary {
  return {
    distinctHours: q.distinctHours,
    firstHour: q.firstHour,
    lastHour: q.lastHour,
    yearsFound: q.yearsFound,
    qualifyingYears: q.qualifyingYears,
    completeness: q.completeness.map((y) => ({ ...y })),
    gaps: q.gaps,
    duplicates: q.duplicates,
    outOfRange: { count: q.outOfRange.count, byField: { ...q.outOfRange.byField }, first: q.outOfRange.first.map((o) => ({ ...o })) },
  };
}

/** What is stored for a record; undefined when no year qualifies. */
export function storedComputation(
  analysis: Analysis,
  source: { fileName: string | null; rowCount: number },
): repo.StoredComputation | undefined {
  const { result, quality } = analysis;
  if (!result.ok) return undefined;
  return {
    methodVersion: result.methodVersion,
    conditions: result.conditions,
    quality: qualitySummary(quality),
    distribution: quality.distribution,
    monthly: quality.monthly,
    fileName: source.fileName,
    rowCount: source.rowCount,
  };
}

/** The sweep index of a record over the given years, packed for storing beside it. */
export function storedSweepIndex(series: HourlySeries, qualifyingYears: readonly number[]): repo.StoredSweepIndex {
  return {
    key: sweepIndexKey(qualifyingYears),
    bytes: packSweepIndex(buildSweepIndex({ series, qualifyingYears })),
  };
}

/**
 * Stores a series as a site's record, with its computed conditions and its sweep index, inside the
 * caller's transaction: the one function every path that gives a site its hourly record goes through.
 * `computed` is the result already worked out for this very series at upload; it is recomputed when
 * absent or made by another method version. `sweepIndex` likewise, when it was built at upload for
 * the same qualifying years.
 */
export async function storeRecord(
  trx: Knex.Transaction,
  siteId: string,
  series: HourlySeries,
  elevationM: number | null,
  source: { fileName: string | null; rowCount: number },
  computed?: repo.StoredComputation | null,
  sweepIndex?: repo.StoredSweepIndex | null,
): Promise<void> {
  const current =
    computed?.methodVersion === METHOD_VERSION ? computed : storedComputation(analyse(series, elevationM), source);
  if (!current) {
    throw new HttpError(422, 'no_qualifying_years', 'No year of the record has enough valid hours (85 %). Nothing was stored.');
  }
  const years = current.conditions.period.qualifyingYears;
  const index = sweepIndex?.key === sweepIndexKey(years) ? sweepIndex : storedSweepIndex(series, years);
  await repo.writeRecord(trx, siteId, series, index);
  await repo.saveComputation(trx, siteId, current);
}

/** Recomputes a site's stored conditions from its stored record (after its elevation or the method changed). */
export async function recompute(trx: Knex.Transaction, siteId: string, elevationM: number | null): Promise<void> {
  const current = await trx('design_conditions')
    .where({ climate_site_id: siteId })
    .first<{ file_name: string | null; row_count: number } | undefined>('file_name', 'row_count');
  if (!current) return;
  const series = await repo.loadRecord(trx, siteId);
  const computed = storedComputation(analyse(series, elevationM), { fileName: current.file_name, rowCount: current.row_count });
  if (computed) await repo.saveComputation(trx, siteId, computed);
}
