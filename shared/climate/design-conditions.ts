/**
 * Outdoor design conditions from an hourly weather record, following the definitions of
 * ASHRAE Handbook—Fundamentals, Ch. 14 (Climatic Design Information), with the conventions fixed by
 * our specification where the handbook leaves a choice (stated beside each step).
 *
 * Pure: no I/O, no clock, no randomness. Nothing is rounded here; rounding is for display.
 */
import {
  METHOD_VERSION,
  type DesignConditions,
  type DesignWarningCode,
  type HumidificationValues,
} from './design-conditions-schema';
import { meanAndSampleSd, RETURN_PERIODS, returnPeriodMinimum } from './extremes';
import { daysInYear, type HourlySeries } from './hourly-series';
import { quantileOfSorted } from './percentile';
import { prepareSeries, QUALIFYING_COMPLETENESS, qualifyingYearMask, type PreparedSeries } from './prepared-series';
import {
  humidityRatioFromDewPoint,
  relativeHumidityFromHumidityRatio,
  STANDARD_SEA_LEVEL_PRESSURE_PA,
  standardPressurePa,
} from './psychrometrics';

/** Fewer qualifying years than this gives a `short-record` warning (ASHRAE's minimum record, [M] in docs/methods.md#percentiles). */
export const MIN_RECORD_YEARS = 8;
/** Base of the heating degree-days, °C (65 °F as tabulated). */
export const HDD_BASE_C = 18.3;
/** A UTC day enters the degree-days when it has at least this many valid hours. */
export const MIN_VALID_HOURS_PER_DAY = 18;
/** Half-width of the dew-point window for the mean coincident dry-bulb, K. */
export const COINCIDENT_WINDOW_K = 0.5;

export interface DesignConditionsOptions {
  /** Site elevation, m: gives the standard station pressure when the series has none. */
  elevationM?: number | null;
}

export interface DesignWarning {
  code: DesignWarningCode;
  /** A plain sentence for the user. */
  message: string;
}

/** What each part of the result was computed from. */
export interface DataUsage {
  qualifyingYears: number[];
  droppedYears: number[];
  /** Valid hourly dry-bulbs (heating, cooling, extremes, monthly means). */
  dryBulbHours: number;
  /** Hours with both a valid dry-bulb and a valid dew point (humidification). */
  dewPointHours: number;
  /** Hours with a valid wind speed (annual wind). */
  windHours: number;
  /** Hours of the coldest month with a valid wind speed. */
  coldestMonthWindHours: number;
  /** Hours at or below the 99.6 % dry-bulb with a valid wind speed. */
  coincidentWindHours: number;
  /** Hours within ±0.5 K of the 99.6 % and 99 % design dew points. */
  coincidentDewPointHours: { dp99_6: number; dp99: number };
  /** UTC days with at least 18 valid hours (degree-days). */
  degreeDays: number;
  /** Pressure used for the humidity ratio, kPa, and where it came from. */
  stationPressureKpa: number;
  pressureSource: 'measured' | 'elevation' | 'sea-level';
}

export type DesignConditionsResult =
  | {
      ok: true;
      methodVersion: string;
      conditions: DesignConditions;
      /** The same codes as `conditions.warnings`, each with a plain message. */
      warnings: DesignWarning[];
      usage: DataUsage;
    }
  | {
      ok: false;
      methodVersion: string;
      error: { code: 'no-data' | 'no-qualifying-years'; message: string };
      warnings: DesignWarning[];
      /** Calendar years found in the record and their completeness (valid hours / hours in year). */
      years: { year: number; completeness: number }[];
    };

const percent = (fraction: number): string => `${(fraction * 100).toFixed(1)} %`;

/**
 * Computes the design conditions of a record. Never throws for bad data: a record without any
 * qualifying year gives `{ ok: false, error }`.
 */
export function computeDesignConditions(
  series: HourlySeries,
  options: DesignConditionsOptions = {},
): DesignConditionsResult {
  return computeFromPrepared(prepareSeries(series), options);
}

/** As `computeDesignConditions`, for a series already passed through `prepareSeries`. */
export function computeFromPrepared(
  prepared: PreparedSeries,
  options: DesignConditionsOptions = {},
): DesignConditionsResult {
  const warnings: DesignWarning[] = [];
  const warn = (code: DesignWarningCode, message: string): void => {
    warnings.push({ code, message });
  };

  if (prepared.duplicates > 0) {
    warn(
      'duplicate-hours',
      `${prepared.duplicates} repeated hour${prepared.duplicates === 1 ? ' was' : 's were'} found; the first value of each hour was kept.`,
    );
  }
  if (prepared.invalidTimes > 0) {
    warn('invalid-times', `${prepared.invalidTimes} row(s) without a usable time were left out.`);
  }
  if (prepared.outOfRangeCount > 0) {
    const first = prepared.outOfRangeExamples[0];
    warn(
      'out-of-range-values',
      `${prepared.outOfRangeCount} value(s) outside physical ranges were treated as missing` +
        (first ? ` (the first: ${first.field} ${first.value} at ${first.time}).` : '.'),
    );
  }

  const yearsFound = prepared.years;
  const dropped = yearsFound.filter((y) => !y.qualifies);
  if (dropped.length > 0) {
    warn(
      'years-dropped',
      `${dropped.length} year(s) had fewer than ${QUALIFYING_COMPLETENESS * 100} % valid hours and were left out: ` +
        dropped.map((y) => `${y.year} (${percent(y.completeness)})`).join(', ') +
        '.',
    );
  }
  const failure = (code: 'no-data' | 'no-qualifying-years', message: string): DesignConditionsResult => ({
    ok: false,
    methodVersion: METHOD_VERSION,
    error: { code, message },
    warnings,
    years: yearsFound.map((y) => ({ year: y.year, completeness: y.completeness })),
  });
  if (yearsFound.length === 0) return failure('no-data', 'The record holds no hourly values.');
  const qualifyingYears = yearsFound.filter((y) => y.qualifies).map((y) => y.year);
  if (qualifyingYears.length === 0) {
    return failure(
      'no-qualifying-years',
      `No calendar year has at least ${QUALIFYING_COMPLETENESS * 100} % valid hourly dry-bulb values, so no design conditions can be computed.`,
    );
  }
  if (qualifyingYears.length < MIN_RECORD_YEARS) {
    warn(
      'short-record',
      `Only ${qualifyingYears.length} qualifying year(s); at least ${MIN_RECORD_YEARS} are recommended, so these values are less reliable.`,
    );
  }

  const { firstYear: maskFirst, mask } = qualifyingYearMask(prepared);
  const n = prepared.length;
  const { year, month, dayNumber, dryBulbC, dewPointC, windSpeedMs, stationPressureKpa } = prepared;

  // ---- Pass 1: samples, monthly means, yearly minima, daily means -----------------------------
  const dbSample = new Float64Array(n);
  const dpSample = new Float64Array(n);
  const windSample = new Float64Array(n);
  let nDb = 0;
  let nDp = 0;
  let nWind = 0;
  let pressureSum = 0;
  let pressureCount = 0;
  const monthSum = new Float64Array(13);
  const monthCount = new Float64Array(13);
  // Per-year accumulators indexed by year − maskFirst.
  const yearMin = new Float64Array(mask.length).fill(Infinity);
  const hddSum = new Float64Array(mask.length);
  const hddDays = new Float64Array(mask.length);
  let dayCurrent = NaN;
  let dayYear = 0;
  let daySum = 0;
  let dayCount = 0;
  let countedDays = 0;
  const flushDay = (): void => {
    if (dayCount >= MIN_VALID_HOURS_PER_DAY) {
      const mean = daySum / dayCount;
      const k = dayYear - maskFirst;
      hddSum[k] = (hddSum[k] ?? 0) + Math.max(0, HDD_BASE_C - mean);
      hddDays[k] = (hddDays[k] ?? 0) + 1;
      countedDays++;
    }
  };

  for (let i = 0; i < n; i++) {
    const y = year[i] ?? 0;
    if (mask[y - maskFirst] !== 1) continue;
    const w = windSpeedMs[i] ?? NaN;
    if (!Number.isNaN(w)) windSample[nWind++] = w;
    const p = stationPressureKpa[i] ?? NaN;
    if (!Number.isNaN(p)) {
      pressureSum += p;
      pressureCount++;
    }
    const t = dryBulbC[i] ?? NaN;
    if (Number.isNaN(t)) continue;
    dbSample[nDb++] = t;
    const dp = dewPointC[i] ?? NaN;
    if (!Number.isNaN(dp)) dpSample[nDp++] = dp;
    const m = month[i] ?? 0;
    monthSum[m] = (monthSum[m] ?? 0) + t;
    monthCount[m] = (monthCount[m] ?? 0) + 1;
    if (t < (yearMin[y - maskFirst] ?? -Infinity)) yearMin[y - maskFirst] = t;
    const d = dayNumber[i] ?? 0;
    if (d !== dayCurrent) {
      flushDay();
      dayCurrent = d;
      dayYear = y;
      daySum = 0;
      dayCount = 0;
    }
    daySum += t;
    dayCount++;
  }
  flushDay();

  const db = dbSample.subarray(0, nDb).sort();
  const dps = dpSample.subarray(0, nDp).sort();
  const winds = windSample.subarray(0, nWind).sort();

  // ---- Dry-bulb percentiles (type 7 on all valid hours of the qualifying years) ---------------
  const heating = { db99_6: quantileOfSorted(db, 0.004), db99: quantileOfSorted(db, 0.01) };
  const cooling = {
    db0_4: quantileOfSorted(db, 0.996),
    db1: quantileOfSorted(db, 0.99),
    db2: quantileOfSorted(db, 0.98),
  };

  // ---- Extreme annual minimum and return periods (Ch. 14, Gumbel by moments) ----------------
  const minima = qualifyingYears.map((y) => yearMin[y - maskFirst] ?? NaN);
  const { mean: minMean, sd: minSd } = meanAndSampleSd(minima);
  const hasSd = Number.isFinite(minSd);
  if (!hasSd) {
    warn(
      'single-year-extremes',
      'With a single qualifying year the spread of the yearly minima is unknown; the return-period values are left empty.',
    );
  }
  const rp = (years: number): number | null => (hasSd ? returnPeriodMinimum(minMean, minSd, years) : null);
  const [rp5, rp10, rp20, rp50] = RETURN_PERIODS.map(rp);

  // ---- Station pressure for the humidity ratio ------------------------------------------------
  let pressurePa: number;
  let pressureSource: DataUsage['pressureSource'];
  if (pressureCount > 0) {
    pressurePa = (pressureSum / pressureCount) * 1000;
    pressureSource = 'measured';
  } else if (options.elevationM !== undefined && options.elevationM !== null && Number.isFinite(options.elevationM)) {
    pressurePa = standardPressurePa(options.elevationM);
    pressureSource = 'elevation';
  } else {
    pressurePa = STANDARD_SEA_LEVEL_PRESSURE_PA;
    pressureSource = 'sea-level';
  }

  // ---- Coldest month ---------------------------------------------------------------------------
  let coldestMonth = 1;
  let coldestMean = Infinity;
  for (let m = 1; m <= 12; m++) {
    const c = monthCount[m] ?? 0;
    if (c === 0) continue;
    const mean = (monthSum[m] ?? 0) / c;
    if (mean < coldestMean) {
      coldestMean = mean;
      coldestMonth = m;
    }
  }

  // ---- Pass 2: coincident values and the coldest month's wind ---------------------------------
  const dpDesign996 = nDp > 0 ? quantileOfSorted(dps, 0.004) : NaN;
  const dpDesign99 = nDp > 0 ? quantileOfSorted(dps, 0.01) : NaN;
  let mcdb996Sum = 0;
  let mcdb996Count = 0;
  let mcdb99Sum = 0;
  let mcdb99Count = 0;
  let coincidentWindSum = 0;
  let coincidentWindCount = 0;
  const coldWind = new Float64Array(nWind);
  let nColdWind = 0;
  for (let i = 0; i < n; i++) {
    if (mask[(year[i] ?? 0) - maskFirst] !== 1) continue;
    const w = windSpeedMs[i] ?? NaN;
    const hasWind = !Number.isNaN(w);
    if (hasWind && month[i] === coldestMonth) coldWind[nColdWind++] = w;
    const t = dryBulbC[i] ?? NaN;
    if (Number.isNaN(t)) continue;
    if (hasWind && t <= heating.db99_6) {
      coincidentWindSum += w;
      coincidentWindCount++;
    }
    const dp = dewPointC[i] ?? NaN;
    if (Number.isNaN(dp)) continue;
    if (Math.abs(dp - dpDesign996) <= COINCIDENT_WINDOW_K) {
      mcdb996Sum += t;
      mcdb996Count++;
    }
    if (Math.abs(dp - dpDesign99) <= COINCIDENT_WINDOW_K) {
      mcdb99Sum += t;
      mcdb99Count++;
    }
  }

  // ---- Humidification ----------------------------------------------------------------------------
  const humidification = (dewPoint: number, sum: number, count: number): HumidificationValues => {
    const w = humidityRatioFromDewPoint(dewPoint, pressurePa);
    const mcdb = count > 0 ? sum / count : null;
    return {
      dewPoint,
      humidityRatio: w * 1000,
      meanCoincidentDryBulb: mcdb,
      relativeHumidity: mcdb === null ? null : relativeHumidityFromHumidityRatio(mcdb, w, pressurePa) * 100,
    };
  };
  let dp99_6: HumidificationValues | null = null;
  let dp99: HumidificationValues | null = null;
  if (nDp === 0) {
    warn('missing-dew-point', 'The record has no dew-point values; humidification values are left empty.');
  } else {
    dp99_6 = humidification(dpDesign996, mcdb996Sum, mcdb996Count);
    dp99 = humidification(dpDesign99, mcdb99Sum, mcdb99Count);
    if (mcdb996Count === 0 || mcdb99Count === 0) {
      warn(
        'no-coincident-hours',
        'No hour has a dew point within ±0.5 K of a design dew point; its mean coincident dry-bulb is left empty.',
      );
    }
    if (pressureSource === 'sea-level') {
      warn(
        'pressure-assumed-sea-level',
        'Neither a station pressure nor the site elevation is known; humidity ratios assume sea-level pressure.',
      );
    }
  }

  // ---- Wind ----------------------------------------------------------------------------------
  const hasWind = nWind > 0;
  if (!hasWind) warn('missing-wind', 'The record has no wind speeds; wind values are left empty.');
  const coldSorted = coldWind.subarray(0, nColdWind).sort();
  const wind = {
    coldestMonth,
    coldestMonth1: nColdWind > 0 ? quantileOfSorted(coldSorted, 0.99) : null,
    coincident99_6: coincidentWindCount > 0 ? coincidentWindSum / coincidentWindCount : null,
    annual1: hasWind ? quantileOfSorted(winds, 0.99) : null,
    annual2_5: hasWind ? quantileOfSorted(winds, 0.975) : null,
    annual5: hasWind ? quantileOfSorted(winds, 0.95) : null,
  };

  // ---- Heating degree-days -------------------------------------------------------------------
  // Our convention for missing days: a UTC day enters only with ≥ 18 valid hours (its mean is the
  // mean of those hours); each qualifying year's sum over its counted days is scaled by
  // days-in-year / counted days, i.e. missing days are assumed to be like the year's counted days
  // on average. The result is the mean over the qualifying years.
  let hddTotal = 0;
  let hddYears = 0;
  for (const y of qualifyingYears) {
    const counted = hddDays[y - maskFirst] ?? 0;
    if (counted === 0) continue;
    hddTotal += ((hddSum[y - maskFirst] ?? 0) * daysInYear(y)) / counted;
    hddYears++;
  }
  const hdd18 = hddYears > 0 ? hddTotal / hddYears : 0;

  const first = yearsFound[0]?.year ?? 0;
  const last = yearsFound[yearsFound.length - 1]?.year ?? first;
  const conditions: DesignConditions = {
    period: { firstYear: first, lastYear: last, qualifyingYears, validHours: nDb },
    heating,
    cooling,
    extremeMin: {
      mean: minMean,
      sd: hasSd ? minSd : null,
      returnPeriod: { '5': rp5 ?? null, '10': rp10 ?? null, '20': rp20 ?? null, '50': rp50 ?? null },
    },
    humidification: { dp99_6, dp99 },
    wind,
    hdd18,
    warnings: warnings.map((w) => w.code),
  };

  return {
    ok: true,
    methodVersion: METHOD_VERSION,
    conditions,
    warnings,
    usage: {
      qualifyingYears,
      droppedYears: dropped.map((y) => y.year),
      dryBulbHours: nDb,
      dewPointHours: nDp,
      windHours: nWind,
      coldestMonthWindHours: nColdWind,
      coincidentWindHours: coincidentWindCount,
      coincidentDewPointHours: { dp99_6: mcdb996Count, dp99: mcdb99Count },
      degreeDays: countedDays,
      stationPressureKpa: pressurePa / 1000,
      pressureSource,
    },
  };
}
