/**
 * An independent, deliberately plain recomputation of the design conditions used to check the
 * engine: plain arrays and objects, `Array.prototype.sort`, `Date` for calendars, the percentile in
 * its 1-based textbook form (docs/methods.md#percentiles: h = (N − 1)·p + 1) and `psychrolib` for the
 * psychrometrics. Same conventions as the specification; no code shared with the engine.
 */
import psy from 'psychrolib';

export interface ReferenceRow {
  time: number;
  dryBulbC: number;
  dewPointC: number;
  windSpeedMs: number;
}

/** Type-7 quantile, 1-based form of docs/methods.md#percentiles */
export function referenceQuantile(ascending: number[], p: number): number {
  const n = ascending.length;
  const h = (n - 1) * p + 1;
  const lower = Math.floor(h);
  const xl = ascending[lower - 1]!;
  if (lower >= n) return xl;
  return xl + (h - lower) * (ascending[lower]! - xl);
}

const ascending = (values: number[]): number[] => [...values].sort((a, b) => a - b);
const mean = (values: number[]): number => values.reduce((s, v) => s + v, 0) / values.length;
const usable = (v: number, min: number, max: number): boolean => Number.isFinite(v) && v >= min && v <= max;

export function referenceConditions(rows: ReferenceRow[], elevationM: number | null) {
  // The first value of each UTC hour wins.
  const byHour = new Map<number, ReferenceRow>();
  for (const row of rows) {
    const key = Math.floor(row.time / 3_600_000);
    if (!byHour.has(key)) byHour.set(key, row);
  }
  const hours = [...byHour.values()].map((r) => {
    const d = new Date(r.time);
    return {
      year: d.getUTCFullYear(),
      month: d.getUTCMonth() + 1,
      day: d.toISOString().slice(0, 10),
      db: usable(r.dryBulbC, -90, 60) ? r.dryBulbC : NaN,
      dp: usable(r.dewPointC, -90, 60) ? r.dewPointC : NaN,
      ws: usable(r.windSpeedMs, 0, 75) ? r.windSpeedMs : NaN,
    };
  });
  const validPerYear = new Map<number, number>();
  for (const h of hours) if (!Number.isNaN(h.db)) validPerYear.set(h.year, (validPerYear.get(h.year) ?? 0) + 1);
  const isLeap = (y: number) => new Date(Date.UTC(y, 1, 29)).getUTCMonth() === 1;
  const qualifying = [...new Set(hours.map((h) => h.year))]
    .filter((y) => (validPerYear.get(y) ?? 0) / (isLeap(y) ? 8784 : 8760) >= 0.85)
    .sort((a, b) => a - b);
  const used = hours.filter((h) => qualifying.includes(h.year));
  const valid = used.filter((h) => !Number.isNaN(h.db));
  const db = ascending(valid.map((h) => h.db));

  const heating = { db99_6: referenceQuantile(db, 0.004), db99: referenceQuantile(db, 0.01) };
  const cooling = {
    db0_4: referenceQuantile(db, 0.996),
    db1: referenceQuantile(db, 0.99),
    db2: referenceQuantile(db, 0.98),
  };

  const minima = qualifying.map((y) => Math.min(...valid.filter((h) => h.year === y).map((h) => h.db)));
  const m = mean(minima);
  const sd = Math.sqrt(minima.reduce((s, v) => s + (v - m) ** 2, 0) / (minima.length - 1));
  const returnPeriod = (n: number) => m - -(Math.sqrt(6) / Math.PI) * (0.5772 + Math.log(Math.log(n / (n - 1)))) * sd;

  psy.SetUnitSystem(psy.SI);
  const pressure = elevationM === null ? 101325 : psy.GetStandardAtmPressure(elevationM);
  const withDp = valid.filter((h) => !Number.isNaN(h.dp));
  const dps = ascending(withDp.map((h) => h.dp));
  const humid = (p: number) => {
    const dewPoint = referenceQuantile(dps, p);
    const w = psy.GetHumRatioFromTDewPoint(dewPoint, pressure);
    const coincident = withDp.filter((h) => Math.abs(h.dp - dewPoint) <= 0.5).map((h) => h.db);
    const mcdb = coincident.length > 0 ? mean(coincident) : null;
    return {
      dewPoint,
      humidityRatio: w * 1000,
      meanCoincidentDryBulb: mcdb,
      relativeHumidity: mcdb === null ? null : psy.GetRelHumFromHumRatio(mcdb, w, pressure) * 100,
    };
  };

  const monthly = new Map<number, number[]>();
  for (const h of valid) {
    const values = monthly.get(h.month) ?? [];
    values.push(h.db);
    monthly.set(h.month, values);
  }
  let coldestMonth = 0;
  let coldestMean = Infinity;
  for (let month = 1; month <= 12; month++) {
    const values = monthly.get(month);
    if (values && mean(values) < coldestMean) {
      coldestMean = mean(values);
      coldestMonth = month;
    }
  }
  const winds = ascending(used.filter((h) => !Number.isNaN(h.ws)).map((h) => h.ws));
  const coldWinds = ascending(used.filter((h) => h.month === coldestMonth && !Number.isNaN(h.ws)).map((h) => h.ws));
  const coincidentWinds = valid.filter((h) => h.db <= heating.db99_6 && !Number.isNaN(h.ws)).map((h) => h.ws);

  // Degree-days: days with ≥ 18 valid hours; each year's sum scaled by days-in-year / counted days.
  const days = new Map<string, { year: number; values: number[] }>();
  for (const h of valid) {
    const entry = days.get(h.day) ?? { year: h.year, values: [] };
    entry.values.push(h.db);
    days.set(h.day, entry);
  }
  const perYear = qualifying.map((y) => {
    const counted = [...days.values()].filter((d) => d.year === y && d.values.length >= 18);
    const sum = counted.reduce((s, d) => s + Math.max(0, 18.3 - mean(d.values)), 0);
    return (sum * (isLeap(y) ? 366 : 365)) / counted.length;
  });

  return {
    qualifyingYears: qualifying,
    validHours: db.length,
    heating,
    cooling,
    extremeMin: {
      mean: m,
      sd,
      returnPeriod: { '5': returnPeriod(5), '10': returnPeriod(10), '20': returnPeriod(20), '50': returnPeriod(50) },
    },
    humidification: { dp99_6: humid(0.004), dp99: humid(0.01) },
    wind: {
      coldestMonth,
      coldestMonth1: referenceQuantile(coldWinds, 0.99),
      coincident99_6: mean(coincidentWinds),
      annual1: referenceQuantile(winds, 0.99),
      annual2_5: referenceQuantile(winds, 0.975),
      annual5: referenceQuantile(winds, 0.95),
    },
    hdd18: mean(perYear),
  };
}
