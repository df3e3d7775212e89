/**
 * Demo weather: a seeded generator of multi-year hourly records for invented sites. Every site,
 * name and coordinate here is invented for demonstrations and tests; none describes a real place
 * or a real weather record. The generator is deterministic for a seed.
 *
 * Model (per UTC hour): seasonal cycle + daily cycle (local solar time) + a weather-scale anomaly
 * (AR(1) with a correlation time of days) − occasional winter cold snaps; dew point = dry-bulb −
 * a positive, slowly varying depression; wind = a slowly varying positive speed; a few short
 * gaps. Values are rounded to 0.1 as station data are.
 */
import { createEmptySeries, daysInYear, MS_PER_HOUR, type HourlySeries } from './hourly-series';

export interface DemoSite {
  id: string;
  /** Invented name, labelled as such. */
  name: string;
  invented: true;
  description: string;
  /** Invented but plausible coordinates, degrees. */
  latitude: number;
  longitude: number;
  elevationM: number;
  /** Standard time offset from UTC, hours. */
  utcOffsetHours: number;
  /** Default seed of the generator for this site. */
  seed: number;
  climate: {
    annualMeanC: number;
    /** Half the difference between the warmest and coldest seasonal mean, K. */
    seasonalAmplitudeK: number;
    /** Day of year (1-based) of the coldest seasonal mean. */
    coldestDay: number;
    /** Half the mean daily range, K (summer; winter is 70 % of it). */
    dailyAmplitudeK: number;
    /** Standard deviation of the weather anomaly, K, and its correlation time, days. */
    anomalySdK: number;
    anomalyDays: number;
    /** Expected cold snaps per winter and their typical depth, K. */
    coldSnapsPerWinter: number;
    coldSnapDepthK: number;
    /** Mean and SD of the dew-point depression, K. */
    dewDepressionK: number;
    dewDepressionSdK: number;
    /** Mean and SD of the wind speed, m/s. */
    windMeanMs: number;
    windSdMs: number;
  };
}

export const DEMO_SITES: readonly DemoSite[] = [
  {
    id: 'kettlerun-crossing',
    name: 'Kettlerun Crossing (invented)',
    invented: true,
    description: 'Invented cold continental inland town on open plains: long cold winters with deep cold snaps.',
    latitude: 51.42,
    longitude: -104.87,
    elevationM: 560,
    utcOffsetHours: -6,
    seed: 0x6b657474,
    climate: {
      annualMeanC: 2.5,
      seasonalAmplitudeK: 17,
      coldestDay: 20,
      dailyAmplitudeK: 6,
      anomalySdK: 5,
      anomalyDays: 3,
      coldSnapsPerWinter: 3,
      coldSnapDepthK: 12,
      dewDepressionK: 4,
      dewDepressionSdK: 2,
      windMeanMs: 4.5,
      windSdMs: 2.2,
    },
  },
  {
    id: 'port-esmery',
    name: 'Port Esmery (invented)',
    invented: true,
    description: 'Invented mild maritime coastal town: small seasonal and daily ranges, humid and windy.',
    latitude: 50.63,
    longitude: -5.71,
    elevationM: 12,
    utcOffsetHours: 0,
    seed: 0x65736d65,
    climate: {
      annualMeanC: 10.8,
      seasonalAmplitudeK: 5,
      coldestDay: 35,
      dailyAmplitudeK: 2.5,
      anomalySdK: 2.2,
      anomalyDays: 2,
      coldSnapsPerWinter: 1,
      coldSnapDepthK: 5,
      dewDepressionK: 2.2,
      dewDepressionSdK: 1.2,
      windMeanMs: 6.2,
      windSdMs: 2.8,
    },
  },
  {
    id: 'tallowmere-vale',
    name: 'Tallowmere Vale (invented)',
    invented: true,
    description: 'Invented high-elevation mountain valley: dry air, large daily range, calm cold nights.',
    latitude: 39.28,
    longitude: -106.12,
    elevationM: 1650,
    utcOffsetHours: -7,
    seed: 0x74616c6c,
    climate: {
      annualMeanC: 5.5,
      seasonalAmplitudeK: 11,
      coldestDay: 18,
      dailyAmplitudeK: 8,
      anomalySdK: 3.8,
      anomalyDays: 2.5,
      coldSnapsPerWinter: 2,
      coldSnapDepthK: 9,
      dewDepressionK: 9,
      dewDepressionSdK: 3,
      windMeanMs: 3,
      windSdMs: 1.6,
    },
  },
];

export const demoSiteIds: readonly string[] = DEMO_SITES.map((s) => s.id);

/** The demo site with this id, or undefined. */
export function findDemoSite(id: string): DemoSite | undefined {
  return DEMO_SITES.find((s) => s.id === id);
}

/** mulberry32: a small, fast 32-bit PRNG (public domain). Returns numbers in [0, 1). */
export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4_294_967_296;
  };
}

/** Standard normal deviates from a uniform source (Box–Muller). */
function normalSource(uniform: () => number): () => number {
  let spare: number | undefined;
  return () => {
    if (spare !== undefined) {
      const s = spare;
      spare = undefined;
      return s;
    }
    const u = 1 - uniform();
    const v = uniform();
    const r = Math.sqrt(-2 * Math.log(u));
    spare = r * Math.sin(2 * Math.PI * v);
    return r * Math.cos(2 * Math.PI * v);
  };
}

export interface DemoSeriesOptions {
  /** Number of calendar years (default 10). */
  years?: number;
  /** Last calendar year (default 2024). */
  endYear?: number;
  /** Overrides the site's default seed. */
  seed?: number;
  /** Probability that a gap of 1–10 missing hours starts at an hour (default 1/2000). */
  gapProbability?: number;
}

/** Rounds to 0.1, never giving −0 (so the values survive a text round trip unchanged). */
const round1 = (v: number): number => {
  const r = Math.round(v * 10) / 10;
  return r === 0 ? 0 : r;
};

/** Generates an hourly record for a demo site: whole UTC calendar years, one row per hour. */
export function generateDemoSeries(site: DemoSite, options: DemoSeriesOptions = {}): HourlySeries {
  const years = options.years ?? 10;
  const endYear = options.endYear ?? 2024;
  if (!Number.isInteger(years) || years < 1 || years > 200)
    throw new RangeError('years must be a whole number from 1 to 200');
  const startYear = endYear - years + 1;
  let hours = 0;
  for (let y = startYear; y <= endYear; y++) hours += daysInYear(y) * 24;
  const series = createEmptySeries(hours);
  const c = site.climate;
  const uniform = mulberry32(options.seed ?? site.seed);
  const normal = normalSource(uniform);
  const gapProbability = options.gapProbability ?? 1 / 2000;

  const phiT = Math.exp(-1 / (c.anomalyDays * 24));
  const innovationT = Math.sqrt(1 - phiT * phiT);
  const phiD = Math.exp(-1 / 24);
  const innovationD = Math.sqrt(1 - phiD * phiD);
  const phiW = Math.exp(-1 / 12);
  const innovationW = Math.sqrt(1 - phiW * phiW);
  let anomaly = normal();
  let depressionNoise = normal();
  let windNoise = normal();
  let snapHoursLeft = 0;
  let snapLength = 0;
  let snapDepth = 0;
  let gapLeft = 0;
  const snapChancePerDay = c.coldSnapsPerWinter / 90;

  const start = Date.UTC(startYear, 0, 1);
  for (let i = 0; i < hours; i++) {
    const time = start + i * MS_PER_HOUR;
    const date = new Date(time);
    const year = date.getUTCFullYear();
    const dayOfYear = Math.floor((time - Date.UTC(year, 0, 1)) / 86_400_000) + 1;
    const utcHour = date.getUTCHours();
    const seasonPhase = (2 * Math.PI * (dayOfYear - c.coldestDay)) / daysInYear(year);
    const winterness = (1 + Math.cos(seasonPhase)) / 2; // 1 at the coldest day, 0 half a year later
    const localHour = (((utcHour + site.utcOffsetHours) % 24) + 24) % 24;
    const daily = Math.cos((2 * Math.PI * (localHour - 15)) / 24);

    anomaly = phiT * anomaly + innovationT * normal();
    depressionNoise = phiD * depressionNoise + innovationD * normal();
    windNoise = phiW * windNoise + innovationW * normal();

    if (snapHoursLeft === 0 && utcHour === 0 && winterness > 0.6 && uniform() < snapChancePerDay) {
      snapLength = 24 * (3 + Math.floor(uniform() * 5));
      snapHoursLeft = snapLength;
      snapDepth = c.coldSnapDepthK * (0.6 + 0.8 * uniform());
    }
    let snap = 0;
    if (snapHoursLeft > 0) {
      snap = snapDepth * Math.sin((Math.PI * (snapLength - snapHoursLeft)) / snapLength);
      snapHoursLeft--;
    }

    const dailyAmplitude = c.dailyAmplitudeK * (1 - 0.3 * winterness);
    const dryBulb =
      c.annualMeanC -
      c.seasonalAmplitudeK * Math.cos(seasonPhase) +
      dailyAmplitude * daily +
      anomaly * c.anomalySdK * (1 + 0.3 * winterness) -
      snap;
    const depression = Math.max(
      0.3,
      c.dewDepressionK * (0.7 + 0.6 * (1 - winterness)) +
        0.5 * dailyAmplitude * (daily + 1) +
        c.dewDepressionSdK * depressionNoise,
    );
    const wind = Math.max(
      0,
      c.windMeanMs * (0.85 + 0.3 * winterness) + c.windSdMs * windNoise + 0.3 * c.windSdMs * normal(),
    );

    if (gapLeft === 0 && uniform() < gapProbability) gapLeft = 1 + Math.floor(uniform() * 10);
    series.time[i] = time;
    if (gapLeft > 0) {
      gapLeft--;
      continue; // all values stay missing
    }
    series.dryBulbC[i] = round1(dryBulb);
    series.dewPointC[i] = round1(dryBulb - depression);
    series.windSpeedMs[i] = round1(wind);
  }
  return series;
}

// ---------------------------------------------------------------------------------------------
// Rendering as upload files

const formatValue = (v: number): string => (Number.isNaN(v) ? '' : String(v));

/** Renders a series as the generic hourly CSV (`time,dry_bulb_c,dew_point_c,wind_speed_ms[,station_pressure_kpa]`). */
export function seriesToCsv(series: HourlySeries): string {
  const n = series.time.length;
  let hasPressure = false;
  for (let i = 0; i < n && !hasPressure; i++) hasPressure = !Number.isNaN(series.stationPressureKpa[i] ?? NaN);
  const lines: string[] = [`time,dry_bulb_c,dew_point_c,wind_speed_ms${hasPressure ? ',station_pressure_kpa' : ''}`];
  for (let i = 0; i < n; i++) {
    const time = new Date(series.time[i] ?? 0).toISOString().slice(0, 16) + 'Z';
    let line = `${time},${formatValue(series.dryBulbC[i] ?? NaN)},${formatValue(series.dewPointC[i] ?? NaN)},${formatValue(series.windSpeedMs[i] ?? NaN)}`;
    if (hasPressure) line += `,${formatValue(series.stationPressureKpa[i] ?? NaN)}`;
    lines.push(line);
  }
  return lines.join('\n') + '\n';
}

const pad = (v: number, width: number): string => String(v).padStart(width, ' ');
const two = (v: number): string => String(v).padStart(2, '0');
const tenths = (v: number): number => (Number.isNaN(v) ? -9999 : Math.round(v * 10));

/**
 * Renders a series as ISD-Lite text (values ×10, −9999 missing; pressure, direction, sky cover and
 * precipitation are written as missing). Times are taken as top-of-hour UTC.
 */
export function seriesToIsdLite(series: HourlySeries): string {
  const n = series.time.length;
  const lines: string[] = [];
  for (let i = 0; i < n; i++) {
    const d = new Date(series.time[i] ?? 0);
    lines.push(
      `${d.getUTCFullYear()} ${two(d.getUTCMonth() + 1)} ${two(d.getUTCDate())} ${two(d.getUTCHours())}` +
        pad(tenths(series.dryBulbC[i] ?? NaN), 6) +
        pad(tenths(series.dewPointC[i] ?? NaN), 6) +
        pad(-9999, 6) +
        pad(-9999, 6) +
        pad(tenths(series.windSpeedMs[i] ?? NaN), 6) +
        pad(-9999, 6) +
        pad(-9999, 6) +
        pad(-9999, 6),
    );
  }
  return lines.join('\n') + '\n';
}
