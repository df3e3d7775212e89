/** Small hand-made hourly series for the engine tests (invented data). */
import { seriesFromRows, type HourlySeries } from '../../shared/climate/hourly-series';

export const HOUR = 3_600_000;

export interface FixtureRow {
  time: number;
  dryBulbC: number;
  dewPointC?: number;
  windSpeedMs?: number;
  stationPressureKpa?: number;
}

export function hoursOfYear(year: number): number {
  return (Date.UTC(year + 1, 0, 1) - Date.UTC(year, 0, 1)) / HOUR;
}

/** One row per hour of a calendar year; `make(i, time)` gives the values of hour i (0-based). */
export function yearRows(
  year: number,
  make: (i: number, time: number) => Omit<FixtureRow, 'time'> | null,
): FixtureRow[] {
  const start = Date.UTC(year, 0, 1);
  const rows: FixtureRow[] = [];
  for (let i = 0; i < hoursOfYear(year); i++) {
    const time = start + i * HOUR;
    const values = make(i, time);
    if (values !== null) rows.push({ time, ...values });
  }
  return rows;
}

export function toSeries(rows: readonly FixtureRow[]): HourlySeries {
  return seriesFromRows({
    time: rows.map((r) => r.time),
    dryBulbC: rows.map((r) => r.dryBulbC),
    dewPointC: rows.map((r) => r.dewPointC ?? NaN),
    windSpeedMs: rows.map((r) => r.windSpeedMs ?? NaN),
    stationPressureKpa: rows.map((r) => r.stationPressureKpa ?? NaN),
  });
}

/** A small deterministic PRNG for fixtures (mulberry32, public domain), independent of the demo module. */
export function fixtureRandom(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = Math.imul(a ^ (a >>> 15), a | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4_294_967_296;
  };
}

/** Random but plausible hourly rows for whole years: seasonal cycle plus noise, dew point and wind. */
export function randomYears(years: readonly number[], seed: number, validFraction = 1): FixtureRow[] {
  const random = fixtureRandom(seed);
  return years.flatMap((year) =>
    yearRows(year, (i) => {
      if (random() > validFraction) return { dryBulbC: NaN };
      const season = -12 * Math.cos((2 * Math.PI * i) / 8760);
      const dryBulbC = Math.round((season + (random() - 0.5) * 30) * 10) / 10;
      return {
        dryBulbC,
        dewPointC: Math.round((dryBulbC - 1 - random() * 8) * 10) / 10,
        windSpeedMs: Math.round(random() * 120) / 10,
      };
    }),
  );
}
