/**
 * Puts a scenario's sweep together from the project's building, the scenario's climate site,
 * equipment list, prices and settings; looks it up in the result cache by a hash of all of that;
 * runs it in the worker pool when it is not there.
 */
import { createHash } from 'node:crypto';
import type { Knex } from 'knex';
import type { FieldIssue } from '@shared/api/api-error';
import type { Building } from '@shared/building/building-schemas';
import { resolveDesignWind } from '@shared/building/heat-loss';
import { METHOD_VERSION } from '@shared/climate/design-conditions-schema';
import { capacityAt } from '@shared/equipment/capacity';
import { equipmentOptionSchema, type EquipmentOption } from '@shared/equipment/equipment-schemas';
import { energyPricesSchema, type EnergyPrices } from '@shared/money/energy-prices';
import { scenarioSettingsSchema, type SweepAnswer, type SweepOptionAnswer } from '@shared/scenarios/scenario-schemas';
import { pricePerKwhOfFuel } from '@shared/money/energy-prices';
import { familyOf, type SweepDesignValues, type SweepOption } from '@shared/sweep/sweep';
import { HttpError } from '../../http/http-error';
import { findSite } from '../climate/climate-repo';
import { listForSweep, storedPrices } from '../equipment/equipment-service';
import { findBuilding } from '../projects/projects-service';
import * as repo from './scenarios-repo';
import type { ScenarioRow, SweepAnswerBody } from './scenarios-repo';
import type { SweepPool } from './sweep-pool';
import type { SweepTask } from './sweep-worker';

/** Bumped whenever the sweep's figures or the answer's shape change, so that old cache entries are not used. */
export const SWEEP_VERSION = 'sweep-2.1.0';

export type { ScenarioRow, SweepAnswerBody } from './scenarios-repo';

export interface PreparedSweep {
  hash: string;
  task: Omit<SweepTask, 'databaseUrl'>;
  meta: Omit<
    SweepAnswerBody,
    | 'inputHash'
    | 'computedAt'
    | 'years'
    | 'timeConstantH'
    | 'rows'
    | 'loadDuration'
    | 'studyPeriodYears'
    | 'energyEscalationPctPerYear'
    | 'heatPumpSizing'
    | 'selectionRule'
    | 'warnings'
    | 'odds'
    | 'uncertainty'
  >;
  /** The prices used (the scenario's or the organisation's), kept with a frozen copy. */
  prices: EnergyPrices;
  /** The cached answer for this scenario as sent, once it has been sent (see `scenarioSweepJson`). */
  answerJson?: SweepJson;
}

/** A sweep answer serialised for sending, with an entity tag of its bytes. */
export interface SweepJson {
  bytes: Buffer;
  etag: string;
}

function toSweepJson(answer: SweepAnswer): SweepJson {
  const bytes = Buffer.from(JSON.stringify(answer));
  return { bytes, etag: `"${createHash('sha256').update(bytes).digest('base64url').slice(0, 27)}"` };
}

/** 422 `scenario_incomplete` with what is missing, field by field. */
export const incomplete = (details: FieldIssue[]) =>
  new HttpError(
    422,
    'scenario_incomplete',
    'This scenario cannot be swept yet: ' + details.map((d) => d.message).join('; '),
    details,
  );

const FAMILY_NAMES = {
  'fuel-fired': 'fuel-fired equipment',
  'heat-pump': 'heat pumps',
  electric: 'electric resistance heat',
} as const;

const CURVE_FROM_C = 20;
const CURVE_TO_C = -45;

function capacityCurve(option: EquipmentOption): SweepOptionAnswer['capacityCurve'] {
  const curve: SweepOptionAnswer['capacityCurve'] = [];
  for (let t = CURVE_FROM_C; t >= CURVE_TO_C; t--) curve.push({ outdoorC: t, capacityW: capacityAt(option, t).totalW });
  return curve;
}

/** The fields of an object that are not undefined (so that they can overlay another). */
function definedOnly<T extends object>(value: T | undefined): Partial<T> {
  if (!value) return {};
  return Object.fromEntries(Object.entries(value).filter(([, v]) => v !== undefined)) as Partial<T>;
}

/**
 * The qualifying years a scenario's sweep uses: all of them, or the latest N (docs/methods.md#recent-years),
 * with the basis in plain words.
 */
export function basisYears(
  qualifying: readonly number[],
  latestYears: number | null,
): { years: number[]; isWindow: boolean; description: string } {
  const span = (ys: readonly number[]) => `${String(ys[0])}–${String(ys[ys.length - 1])}`;
  if (latestYears === null || latestYears >= qualifying.length) {
    const whole = `Whole record (${span(qualifying)}, ${qualifying.length} years)`;
    return {
      years: [...qualifying],
      isWindow: false,
      description:
        latestYears === null ? whole : `${whole}; it has fewer than the ${latestYears} recent years asked for`,
    };
  }
  const years = qualifying.slice(qualifying.length - latestYears);
  return { years, isWindow: true, description: `Latest ${latestYears} years of the record (${span(years)})` };
}

/** Everything a sweep of this scenario depends on, or 422 with what is missing. */
export async function prepareSweep(db: Knex, scenario: ScenarioRow): Promise<PreparedSweep> {
  // Settings stored before a setting existed take its default.
  const settings = scenarioSettingsSchema.parse(scenario.settings);
  const problems: FieldIssue[] = [];
  const orgId = scenario.organization_id;
  const project = await findBuilding(db, orgId, scenario.project_id);
  const building = project?.building ?? null;
  if (building === null)
    problems.push({ path: 'building', message: 'Describe the building on the project page first' });

  const site = scenario.climate_site_id ? await findSite(db, orgId, scenario.climate_site_id) : undefined;
  let designConditions: SweepDesignValues | null = null;
  let windValues: { coincident99_6?: number | null; coldestMonth1?: number | null } | null = null;
  let record: SweepTask['record'] = null;
  let climateBasis: NonNullable<SweepAnswerBody['climateBasis']> = {
    description: 'Published design values (no hourly record)',
    latestYears: null,
    estimateLabel: null,
  };
  if (!site) {
    problems.push({ path: 'climateSiteId', message: 'Choose a climate site' });
  } else if (site.computed) {
    const c = site.computed.conditions;
    const table = site.publishedValues; // present when the record is estimated from another site's
    designConditions = table
      ? {
          heating: table.heating,
          extremeMin: {
            ...c.extremeMin,
            ...definedOnly(table.extremeMin),
            returnPeriod: { ...c.extremeMin.returnPeriod, ...definedOnly(table.extremeMin?.returnPeriod) },
          },
        }
      : { heating: c.heating, extremeMin: c.extremeMin };
    windValues = table?.wind ? { ...c.wind, ...definedOnly(table.wind) } : c.wind;
    const basis = basisYears(c.period.qualifyingYears, scenario.settings.climateBasisYears ?? null);
    record = {
      siteId: site.id,
      key: `${site.id}@${site.computed.computedAt}#${site.computed.rowCount}`,
      qualifyingYears: basis.years,
      // A recent-years basis takes its design values from those years (an estimated record keeps the table's).
      windowDesignValues: basis.isWindow && !table,
    };
    climateBasis = {
      description: basis.description,
      latestYears: basis.isWindow ? basis.years.length : null,
      estimateLabel: site.estimate?.label ?? null,
    };
  } else if (site.publishedValues) {
    const p = site.publishedValues;
    designConditions = { heating: p.heating, extremeMin: p.extremeMin };
    windValues = p.wind ?? null;
  } else {
    problems.push({
      path: 'climateSiteId',
      message: `"${site.name}" has no design values yet: upload and confirm its hourly record`,
    });
  }

  const list = scenario.equipment_list_id ? await listForSweep(db, orgId, scenario.equipment_list_id) : undefined;
  const options: SweepOption[] = [];
  const notes: string[] = [];
  if (!list) {
    problems.push({ path: 'equipmentListId', message: 'Choose an equipment list' });
  } else {
    const rows = list.options;
    const wanted = settings.optionLabels;
    const family = settings.equipmentFamily;
    const seen = new Set<string>();
    for (const r of rows) {
      const option = equipmentOptionSchema.parse(r.option);
      if (wanted !== null && !wanted.includes(option.label)) continue;
      if (family !== null && familyOf(option) !== family) continue;
      seen.add(option.label);
      options.push({ ...option, id: String(r.position + 1) });
    }
    const missing = (wanted ?? []).filter((l) => !seen.has(l));
    if (missing.length > 0) {
      notes.push(
        `${missing.length === 1 ? 'An option' : `${missing.length} options`} chosen for this scenario ${missing.length === 1 ? 'is' : 'are'} no longer in the list: ${missing.join(', ')}`,
      );
    }
    if (options.length === 0) {
      problems.push(
        family !== null && rows.length > 0
          ? {
              path: 'settings.equipmentFamily',
              message: `"${list.name}" has no ${FAMILY_NAMES[family]} among the options considered`,
            }
          : {
              path: wanted === null ? 'equipmentListId' : 'settings.optionLabels',
              message:
                wanted === null
                  ? `"${list.name}" has no options yet`
                  : 'None of the chosen options is in the list any more',
            },
      );
    }
  }

  let prices = settings.prices;
  if (prices === null) {
    const stored = await storedPrices(db, orgId);
    prices = stored === undefined ? null : energyPricesSchema.parse(stored);
  }
  if (prices === null) {
    problems.push({
      path: 'settings.prices',
      message: 'Enter the organisation’s energy prices, or give this scenario its own',
    });
  }

  if (prices !== null) {
    // Every option must have a price for its energy, or its running and life-cycle costs are unknown.
    const unpriced = [...new Set(options.filter((o) => pricePerKwhOfFuel(o.fuel, prices) === null).map((o) => o.fuel))];
    for (const fuel of unpriced) {
      const users = options.filter((o) => o.fuel === fuel).map((o) => `"${o.label}"`);
      problems.push({
        path: 'settings.prices',
        message: `Enter a ${fuel} price: ${users.join(', ')} ${users.length === 1 ? 'uses' : 'use'} ${fuel}`,
      });
    }
  }
  if (building !== null) {
    const warmest = building.indoorDesignC - 1;
    settings.extraDesignC.forEach((t, i) => {
      if (t > warmest) {
        problems.push({
          path: `settings.extraDesignC.${i}`,
          message: `A design temperature must be at most ${warmest} °C (1 K below the indoor temperature); ${t} °C is not`,
        });
      }
    });
  }

  if (problems.length > 0 || building === null || designConditions === null || prices === null || !site || !list) {
    throw incomplete(problems);
  }
  const sized: Building = { ...building, safetyFactorPct: settings.safetyFactorPct ?? building.safetyFactorPct };
  const wind = resolveDesignWind(building.designWind, windValues);
  // Notes are kept with cached answers, so they name no quantity in one unit system (the screen shows the wind in the user's units).
  if (wind.fellBack)
    notes.push(
      `The building's design wind choice has no value at "${site.name}"; the trade default wind speed is used`,
    );
  if (record === null)
    notes.push(
      `"${site.name}" has published values only: running cost, equivalent full-load hours and unmet hours need an hourly record`,
    );

  const input: SweepTask['input'] = {
    building: sized,
    options,
    prices,
    economics: {
      discountRatePct: settings.discountRatePct,
      studyPeriodYears: settings.studyPeriodYears,
      energyEscalationPctPerYear: settings.energyEscalationPctPerYear,
    },
    designConditions,
    designWindMs: wind.windMs,
    extraDesignC: settings.extraDesignC,
    heatPumpSizing: settings.heatPumpSizing,
  };
  const odds: SweepTask['odds'] = {
    uncertainty: { ...settings.uncertainty, tolerances: settings.tolerances },
    periodYears: settings.studyPeriodYears,
  };
  const hash = createHash('sha256')
    .update(JSON.stringify({ v: SWEEP_VERSION, m: METHOD_VERSION, input, record, odds }))
    .digest('hex');
  return {
    hash,
    task: { input, record, odds },
    prices,
    meta: {
      climateSiteName: site.name,
      equipmentListName: list.name,
      currency: prices.currency,
      hasRecord: record !== null,
      designWindMs: wind.windMs,
      indoorDesignC: sized.indoorDesignC,
      discountRatePct: settings.discountRatePct,
      climateBasis,
      options: options.map((o) => ({
        id: o.id,
        label: o.label,
        kind: o.kind,
        fuel: o.fuel,
        lifeYears: o.lifeYears,
        installedPrice: o.installedPrice,
        capacityCurve: capacityCurve(o),
      })),
      notes,
    },
  };
}

/**
 * The most recently used results of this process, by input hash: a result never changes for its
 * hash, so reading it again from PostgreSQL is only needed after a restart or on another process.
 */
const RECENT_MAX = 200;
const recent = new Map<string, SweepAnswerBody>();
function remember(hash: string, body: SweepAnswerBody): void {
  recent.delete(hash);
  recent.set(hash, body);
  if (recent.size > RECENT_MAX) {
    const oldest = recent.keys().next().value;
    if (oldest !== undefined) recent.delete(oldest);
  }
}

/** The sweep of a prepared scenario: from the cache, or computed in the pool and then cached. */
export async function computeSweep(
  db: Knex,
  pool: SweepPool,
  databaseUrl: string,
  prepared: PreparedSweep,
  options: { onlyCached?: boolean } = {},
): Promise<{ body: SweepAnswerBody; cached: boolean } | null> {
  const remembered = recent.get(prepared.hash);
  if (remembered) return { body: { ...remembered, ...prepared.meta }, cached: true };
  const hit = await repo.findResult(db, prepared.hash);
  if (hit) {
    // The last-used time is for pruning old entries: an hour's precision is enough, and spares a write per read.
    if (Date.now() - hit.used_at.getTime() > 3_600_000) await repo.touchResult(db, prepared.hash);
    remember(prepared.hash, hit.result);
    return { body: { ...hit.result, ...prepared.meta }, cached: true };
  }
  if (options.onlyCached) return null;
  const { result, loadDuration } = await pool.run(prepared.hash, { ...prepared.task, databaseUrl });
  const body: SweepAnswerBody = {
    ...prepared.meta,
    inputHash: prepared.hash,
    computedAt: new Date().toISOString(),
    years: result.years,
    timeConstantH: result.timeConstantH,
    studyPeriodYears: result.studyPeriodYears,
    energyEscalationPctPerYear: result.energyEscalationPctPerYear,
    heatPumpSizing: result.heatPumpSizing,
    selectionRule: result.selectionRule,
    warnings: result.warnings,
    rows: result.rows,
    loadDuration: loadDuration ? { points: loadDuration } : null,
    odds: result.odds,
    uncertainty: result.uncertainty,
  };
  await repo.insertResult(db, prepared.hash, body);
  remember(prepared.hash, body);
  return { body, cached: false };
}

function inputsKey(db: Knex, row: ScenarioRow): Promise<string> {
  return row.inputs_key !== undefined ? Promise.resolve(row.inputs_key) : repo.inputsKeyOf(db, row.id);
}

const PREPARED_MAX = 500;
const preparedByScenario = new Map<string, { key: string; prepared: PreparedSweep }>();

/** `prepareSweep`, reused while none of the scenario's inputs has changed (one query to tell). */
async function prepareSweepReusing(db: Knex, row: ScenarioRow): Promise<PreparedSweep> {
  const key = await inputsKey(db, row);
  const hit = preparedByScenario.get(row.id);
  if (hit?.key === key) return hit.prepared;
  const prepared = await prepareSweep(db, row);
  preparedByScenario.delete(row.id);
  preparedByScenario.set(row.id, { key, prepared });
  if (preparedByScenario.size > PREPARED_MAX) {
    const oldest = preparedByScenario.keys().next().value;
    if (oldest !== undefined) preparedByScenario.delete(oldest);
  }
  return prepared;
}

/** A frozen scenario's answer: the result kept with it, never computed again. */
function frozenAnswer(row: ScenarioRow): SweepAnswer | null {
  return row.frozen_at && row.frozen_result
    ? { ...row.frozen_result, scenarioId: row.id, cached: true, frozen: true }
    : null;
}

/** The sweep answer of a scenario: its frozen result, or the cache, or a new run (null: `onlyCached` and not cached). */
export async function scenarioSweep(
  db: Knex,
  pool: SweepPool,
  databaseUrl: string,
  row: ScenarioRow,
  options: { onlyCached?: boolean } = {},
): Promise<SweepAnswer | null> {
  const frozen = frozenAnswer(row);
  if (frozen) return frozen;
  const prepared = await prepareSweepReusing(db, row);
  const out = await computeSweep(db, pool, databaseUrl, prepared, options);
  return out && { ...out.body, scenarioId: row.id, cached: out.cached, frozen: false };
}

/**
 * `scenarioSweep` serialised: a cached answer is serialised once per prepared inputs and then sent as
 * it is, so that reading a cached sweep costs no JSON encoding or hashing of its ~50 kB.
 */
export async function scenarioSweepJson(
  db: Knex,
  pool: SweepPool,
  databaseUrl: string,
  row: ScenarioRow,
  options: { onlyCached?: boolean } = {},
): Promise<SweepJson | null> {
  const frozen = frozenAnswer(row);
  if (frozen) return toSweepJson(frozen);
  const prepared = await prepareSweepReusing(db, row);
  if (prepared.answerJson) return prepared.answerJson;
  const out = await computeSweep(db, pool, databaseUrl, prepared, options);
  if (!out) return null;
  const json = toSweepJson({ ...out.body, scenarioId: row.id, cached: out.cached, frozen: false });
  if (out.cached) prepared.answerJson = json;
  return json;
}
