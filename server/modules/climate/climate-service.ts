import type { Knex } from 'knex';
import {
  estimateLabel,
  type ClimateSite,
  type QualitySummary,
  type RecentYears,
  type RecordWindow,
  type SiteEstimate,
} from '@shared/climate/climate-schemas';
import {
  computeDesignConditions,
  computeFromPrepared,
  type DesignConditionsResult,
} from '@shared/climate/design-conditions';
import { METHOD_VERSION, type DesignConditions } from '@shared/climate/design-conditions-schema';
import { latestYearsSeries, RECENT_WINDOWS } from '@shared/climate/record-window';
import { SHIFT_STRETCH_VERSION, shiftAndStretch } from '@shared/climate/shift-stretch';
import { coldestHourTrend } from '@shared/climate/trend';
import type { HourlySeries } from '@shared/climate/hourly-series';
import { prepareSeries, type PreparedSeries } from '@shared/climate/prepared-series';
import { qualityReportFromPrepared, type QualityReport } from '@shared/climate/quality-report';
import { buildSweepIndex, packSweepIndex, sweepIndexKey } from '@shared/sweep/sweep-index';
import { HttpError } from '../../http/http-error';
import * as repo from './climate-repo';
import { atStoragePrecision } from './series-codec';

export interface Analysis {
  result: DesignConditionsResult;
  quality: QualityReport;
  /** The checked, ordered hours both were worked out from; the sweep index is built from them too. */
  prepared: PreparedSeries;
}

/** Checks and computes a record once (ordering, de-duplication and range checks shared by both). */
export function analyse(series: HourlySeries, elevationM: number | null): Analysis {
  const prepared = prepareSeries(series);
  return {
    result: computeFromPrepared(prepared, { elevationM }),
    quality: qualityReportFromPrepared(prepared),
    prepared,
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
    outOfRange: {
      count: q.outOfRange.count,
      byField: { ...q.outOfRange.byField },
      first: q.outOfRange.first.map((o) => ({ ...o })),
    },
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
export function storedSweepIndex(
  record: HourlySeries | PreparedSeries,
  qualifyingYears: readonly number[],
): repo.StoredSweepIndex {
  return {
    key: sweepIndexKey(qualifyingYears),
    bytes: packSweepIndex(
      buildSweepIndex('hour' in record ? { prepared: record, qualifyingYears } : { series: record, qualifyingYears }),
    ),
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
    throw new HttpError(
      422,
      'no_qualifying_years',
      'No year of the record has enough valid hours (85 %). Nothing was stored.',
    );
  }
  const years = current.conditions.period.qualifyingYears;
  const index = sweepIndex?.key === sweepIndexKey(years) ? sweepIndex : storedSweepIndex(series, years);
  await repo.writeRecord(trx, siteId, series, index);
  await repo.saveComputation(trx, siteId, current);
}

/** Recomputes a site's stored conditions from its stored record (after its elevation or the method changed). */
export async function recompute(trx: Knex.Transaction, siteId: string, elevationM: number | null): Promise<void> {
  const current = await repo.computationSource(trx, siteId);
  if (!current) return;
  const series = await repo.loadRecord(trx, siteId);
  const computed = storedComputation(analyse(series, elevationM), {
    fileName: current.file_name,
    rowCount: current.row_count,
  });
  if (computed) await repo.saveComputation(trx, siteId, computed);
}

/**
 * Estimates a published site's hourly record from a reference site's record by shift and stretch
 * (docs/methods.md#shift-and-stretch) and stores it as the site's record, with its provenance, inside
 * the caller's transaction. A refused adjustment answers 422 and stores nothing.
 */
export async function estimateRecord(
  trx: Knex.Transaction,
  organizationId: string,
  siteId: string,
  referenceSiteId: string,
): Promise<void> {
  const site = await repo.findSite(trx, organizationId, siteId);
  if (!site) throw new HttpError(404, 'not_found', 'That climate site was not found');
  const refuse = (message: string) =>
    new HttpError(422, 'estimate_refused', message, [{ path: 'referenceSiteId', message }]);
  if (site.sourceKind !== 'published' || !site.publishedValues) {
    throw new HttpError(422, 'not_published', 'Only a site with published values takes an estimated record', [
      { path: 'siteId', message: 'This site has its own hourly record' },
    ]);
  }
  if (referenceSiteId === siteId)
    throw refuse('A site cannot be its own reference; choose a site with an hourly record');
  const reference = await repo.findSite(trx, organizationId, referenceSiteId);
  if (!reference) throw refuse('That reference site was not found');
  if (reference.sourceKind !== 'hourly' || !reference.computed) {
    throw refuse(`"${reference.name}" has no hourly record of its own to estimate from`);
  }
  const published = site.publishedValues;
  const result = shiftAndStretch(await repo.loadRecord(trx, referenceSiteId), {
    db99_6: published.heating.db99_6,
    hdd18: published.hdd18 ?? null,
  });
  if (!result.ok) throw refuse(result.message);
  const series = atStoragePrecision(result.series);
  await storeRecord(trx, siteId, series, site.elevationM ?? published.elevation ?? null, {
    fileName: `${reference.name}'s record, adjusted (an estimate)`,
    rowCount: series.time.length,
  });
  const estimate: SiteEstimate = {
    referenceSiteId,
    referenceSiteName: reference.name,
    shiftK: result.shiftK,
    stretch: result.stretch,
    referenceMeanC: result.referenceMeanC,
    methodVersion: result.methodVersion,
    matched: { db99_6: published.heating.db99_6, hdd18: published.hdd18 ?? null },
    referenceComputedAt: reference.computed.computedAt,
    computedAt: new Date().toISOString(),
    label: estimateLabel(reference.name, site.name),
  };
  await repo.saveEstimate(trx, siteId, estimate);
}

/** Whether a site's estimate no longer matches its published values or its reference's record. */
export function estimateIsStale(site: ClimateSite, reference: ClimateSite | undefined): boolean {
  const e = site.estimate;
  if (!e || !site.publishedValues) return false;
  return (
    e.methodVersion !== SHIFT_STRETCH_VERSION ||
    e.matched.db99_6 !== site.publishedValues.heating.db99_6 ||
    e.matched.hdd18 !== (site.publishedValues.hdd18 ?? null) ||
    e.label !== estimateLabel(e.referenceSiteName, site.name) ||
    (reference?.computed !== null &&
      reference?.computed !== undefined &&
      reference.computed.computedAt !== e.referenceComputedAt)
  );
}

/**
 * Estimates again, inside the caller's transaction, every site whose estimate is made from this
 * reference. A site whose estimate the new record refuses keeps its stored one (a refusal is decided
 * before anything is written) and shows it as made from the reference's earlier record.
 */
export async function refreshEstimatesFrom(
  trx: Knex.Transaction,
  organizationId: string,
  referenceSiteId: string,
): Promise<void> {
  for (const id of await repo.sitesEstimatedFrom(trx, organizationId, referenceSiteId)) {
    try {
      await estimateRecord(trx, organizationId, id, referenceSiteId);
    } catch (err) {
      if (!(err instanceof HttpError) || err.status !== 422) throw err;
    }
  }
}

const recentCache = new Map<string, RecentYears>();
const RECENT_CACHE_MAX = 50;

function windowOf(conditions: DesignConditions, latestYears: number | null): RecordWindow {
  return {
    latestYears,
    firstYear: conditions.period.qualifyingYears[0] ?? conditions.period.firstYear,
    lastYear:
      conditions.period.qualifyingYears[conditions.period.qualifyingYears.length - 1] ?? conditions.period.lastYear,
    qualifyingYearCount: conditions.period.qualifyingYears.length,
    heating: conditions.heating,
    extremeMinMean: conditions.extremeMin.mean,
    returnPeriod50: conditions.extremeMin.returnPeriod['50'],
    hdd18: conditions.hdd18,
  };
}

/**
 * The design values of the whole record and of its latest 10 and 15 qualifying years, and the trend
 * of the coldest hour (docs/methods.md#recent-years, docs/methods.md#trend-of-the-coldest-hour).
 * Kept per stored computation, so a record is read once.
 */
export async function recentYears(db: Knex, site: ClimateSite): Promise<RecentYears | undefined> {
  if (!site.computed) return undefined;
  const key = `${site.id}@${site.computed.computedAt}`;
  const hit = recentCache.get(key);
  if (hit) return hit;
  const series = await repo.loadRecord(db, site.id);
  const prepared = prepareSeries(series);
  const elevationM = site.elevationM;
  const whole = computeFromPrepared(prepared, { elevationM });
  if (!whole.ok) return undefined;
  const windows: RecordWindow[] = [windowOf(whole.conditions, null)];
  for (const n of RECENT_WINDOWS) {
    if (whole.conditions.period.qualifyingYears.length < n) continue;
    const recent = computeDesignConditions(latestYearsSeries(series, n, prepared), { elevationM });
    if (recent.ok) windows.push(windowOf(recent.conditions, n));
  }
  const trend = coldestHourTrend(prepared);
  const answer: RecentYears = { windows, trend, estimateLabel: site.estimate?.label ?? null };
  recentCache.set(key, answer);
  if (recentCache.size > RECENT_CACHE_MAX) {
    const oldest = recentCache.keys().next().value;
    if (oldest !== undefined) recentCache.delete(oldest);
  }
  return answer;
}

// --- Climate sites: the rules behind /api/v1/climate-sites ---------------------------------------

export const siteNotFound = () => new HttpError(404, 'not_found', 'That climate site was not found');

/** The site, or 404. */
export async function requireSite(db: Knex, organizationId: string, siteId: string): Promise<ClimateSite> {
  const site = await repo.findSite(db, organizationId, siteId);
  if (!site) throw siteNotFound();
  return site;
}

export async function createSite(
  db: Knex,
  organizationId: string,
  userId: string,
  input: repo.SiteWrite & { name: string; sourceKind: ClimateSite['sourceKind'] },
): Promise<{ id: string; site: ClimateSite | undefined }> {
  const id = await repo.insertSite(db, organizationId, userId, input);
  return { id, site: await repo.findSite(db, organizationId, id) };
}

/** The site as it is shown: its conditions recomputed if they were stored by an older method, its estimate made again if its reference changed. */
export async function currentSite(db: Knex, organizationId: string, siteId: string): Promise<ClimateSite | undefined> {
  let site: ClimateSite | undefined = await requireSite(db, organizationId, siteId);
  if (site.computed && site.computed.methodVersion !== METHOD_VERSION) {
    // Stored with an older method: recompute from the stored record.
    const elevation = site.elevationM;
    await db.transaction((trx) => recompute(trx, siteId, elevation));
    site = await repo.findSite(db, organizationId, siteId);
  }
  const referenceId = site?.estimate?.referenceSiteId;
  if (site && referenceId && estimateIsStale(site, await repo.findSite(db, organizationId, referenceId))) {
    // The reference's record or the method changed since: estimate again (a refusal keeps the stored estimate).
    try {
      await db.transaction((trx) => estimateRecord(trx, organizationId, siteId, referenceId));
      site = await repo.findSite(db, organizationId, siteId);
    } catch (err) {
      if (!(err instanceof HttpError)) throw err;
    }
  }
  return site;
}

export async function estimateSite(
  db: Knex,
  organizationId: string,
  siteId: string,
  referenceSiteId: string,
): Promise<ClimateSite | undefined> {
  await requireSite(db, organizationId, siteId);
  await db.transaction((trx) => estimateRecord(trx, organizationId, siteId, referenceSiteId));
  return repo.findSite(db, organizationId, siteId);
}

export async function siteRecentYears(db: Knex, organizationId: string, siteId: string): Promise<RecentYears> {
  const answer = await recentYears(db, await requireSite(db, organizationId, siteId));
  if (!answer) throw new HttpError(404, 'no_record', 'This site has no hourly record yet');
  return answer;
}

export async function patchSite(
  db: Knex,
  organizationId: string,
  siteId: string,
  patch: repo.SiteWrite,
): Promise<ClimateSite | undefined> {
  await db.transaction(async (trx) => {
    const before = await repo.findSite(trx, organizationId, siteId);
    if (!before) throw siteNotFound();
    if (patch.publishedValues && before.sourceKind !== 'published') {
      throw new HttpError(422, 'not_published', 'This site computes its values from an hourly record', [
        { path: 'publishedValues', message: 'Only sites with published values take typed-in values' },
      ]);
    }
    await repo.updateSite(trx, organizationId, siteId, patch);
    // The station pressure, and so the humidity ratios, follow the elevation.
    if (patch.elevationM !== undefined && patch.elevationM !== before.elevationM && before.computed) {
      await recompute(trx, siteId, patch.elevationM);
    }
    // An estimated record follows the published values it was matched to (a refusal undoes the change).
    const after = await repo.findSite(trx, organizationId, siteId);
    const referenceId = after?.estimate?.referenceSiteId;
    if (after && referenceId && estimateIsStale(after, undefined)) {
      await estimateRecord(trx, organizationId, siteId, referenceId);
    }
    // Sites estimated from this one follow its record.
    if (patch.elevationM !== undefined && patch.elevationM !== before.elevationM && before.computed) {
      await refreshEstimatesFrom(trx, organizationId, siteId);
    }
  });
  return repo.findSite(db, organizationId, siteId);
}

export async function deleteSite(db: Knex, organizationId: string, siteId: string): Promise<void> {
  if (!(await repo.deleteSite(db, organizationId, siteId))) throw siteNotFound();
}

export async function siteChartData(
  db: Knex,
  organizationId: string,
  siteId: string,
): Promise<NonNullable<Awaited<ReturnType<typeof repo.chartData>>>> {
  const data = await repo.chartData(db, organizationId, siteId);
  if (!data) {
    await requireSite(db, organizationId, siteId);
    throw new HttpError(404, 'no_record', 'This site has no hourly record yet');
  }
  return data;
}

export const listSites = repo.listSites;
