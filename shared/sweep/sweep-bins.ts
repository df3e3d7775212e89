/**
 * Sweep step 2, index: the hours of a record grouped by outdoor temperature ("bins", and by
 * temperature and wind for air leakage that follows the wind), the building's load and load
 * conductance in each bin, and the load-duration curve drawn from them. Every hour-based figure of an
 * option depends only on the bin, so sums over 263,000 hours become sums over some 600 bins.
 * Pure: no I/O.
 */
import type { Building } from '../building/building-schemas';
import { effectiveConductanceWPerK, heatLoss } from '../building/heat-loss';
import { recordHours, type Hours } from './sweep-prepare';
import type { SweepRecord } from './sweep-types';

/**
 * The hours of a record grouped by outdoor temperature ("bins"), and, for air leakage that follows
 * the wind, by temperature and wind. Every hour-based quantity of an option is a function of the
 * hour's load and capacity, which depend only on the bin; so a sum over the hours is a sum over the
 * bins weighted by their hour counts, and only the hours of bins the option cannot meet are walked
 * in time order (for the worst year and the sag). A record of 30 years at 0.1 °C resolution has
 * some 600 temperature bins instead of 263,000 hours.
 */
export interface Bins {
  t: Float64Array;
  /** NaN in temperature-only bins, and where the record has no wind value. */
  w: Float64Array;
  count: Float64Array;
  /** Hours of bin b: hourIdx[start[b] .. start[b + 1]), in time order. */
  start: Int32Array;
  hourIdx: Int32Array;
  /** Bin of every hour. */
  binOfHour: Int32Array;
}

/** A record ready for sweeps; build it once with `indexSweepRecord` and reuse it for any building and options. */
export interface SweepRecordIndex {
  readonly kind: 'sweep-record-index';
  readonly hours: Hours;
  /** Built on first use. */
  byTemperature: Bins | null;
  byTemperatureAndWind: Bins | null;
}

export function indexSweepRecord(record: SweepRecord): SweepRecordIndex {
  return { kind: 'sweep-record-index', hours: recordHours(record), byTemperature: null, byTemperatureAndWind: null };
}

/** Number of years and valid hours of an indexed record. */
export function sweepRecordSize(index: SweepRecordIndex): { years: number; hours: number } {
  return { years: index.hours.years.length, hours: index.hours.n };
}

/**
 * Bin of every hour, and the bins' keys, in order of first appearance. Temperatures on a 0.1 K grid
 * (as every record read from text is) are binned through an array; others through a map.
 */
export function binKeys(hours: Hours, withWind: boolean): { binOfHour: Int32Array; keys: { t: number; w: number }[] } {
  const { n, outdoorC, windMs } = hours;
  const binOfHour = new Int32Array(n);
  const keys: { t: number; w: number }[] = [];
  if (!withWind) {
    let lo = Infinity;
    let hi = -Infinity;
    let onGrid = true;
    for (let i = 0; i < n && onGrid; i++) {
      const t = outdoorC[i] ?? 0;
      const k = Math.round(t * 10);
      if (k / 10 !== t) onGrid = false;
      if (k < lo) lo = k;
      if (k > hi) hi = k;
    }
    if (onGrid && n > 0 && hi - lo < 100_000) {
      const slot = new Int32Array(hi - lo + 1).fill(-1);
      for (let i = 0; i < n; i++) {
        const k = Math.round((outdoorC[i] ?? 0) * 10) - lo;
        let b = slot[k] ?? -1;
        if (b < 0) {
          b = keys.length;
          slot[k] = b;
          keys.push({ t: outdoorC[i] ?? 0, w: NaN });
        }
        binOfHour[i] = b;
      }
      return { binOfHour, keys };
    }
  }
  const byT = new Map<number, number>();
  const byTW = new Map<number, Map<number, number>>();
  for (let i = 0; i < n; i++) {
    const t = outdoorC[i] ?? 0;
    let b: number | undefined;
    if (withWind) {
      const w = windMs[i] ?? NaN;
      let inner = byTW.get(t);
      if (inner === undefined) {
        inner = new Map();
        byTW.set(t, inner);
      }
      b = inner.get(w);
      if (b === undefined) {
        b = keys.length;
        keys.push({ t, w });
        inner.set(w, b);
      }
    } else {
      b = byT.get(t);
      if (b === undefined) {
        b = keys.length;
        keys.push({ t, w: NaN });
        byT.set(t, b);
      }
    }
    binOfHour[i] = b;
  }
  return { binOfHour, keys };
}

export function buildBins(hours: Hours, withWind: boolean): Bins {
  const { n } = hours;
  const { binOfHour, keys } = binKeys(hours, withWind);
  // Bins in ascending temperature (then wind) so that consecutive bins share a capacity evaluation.
  const order = keys
    .map((_, b) => b)
    .sort((a, b) => {
      const ka = keys[a] ?? { t: 0, w: 0 };
      const kb = keys[b] ?? { t: 0, w: 0 };
      return ka.t - kb.t || (ka.w || 0) - (kb.w || 0);
    });
  const rank = new Int32Array(keys.length);
  order.forEach((b, r) => (rank[b] = r));
  const nBins = keys.length;
  const t = new Float64Array(nBins);
  const w = new Float64Array(nBins);
  const count = new Float64Array(nBins);
  order.forEach((b, r) => {
    t[r] = keys[b]?.t ?? 0;
    w[r] = keys[b]?.w ?? NaN;
  });
  for (let i = 0; i < n; i++) {
    const r = rank[binOfHour[i] ?? 0] ?? 0;
    binOfHour[i] = r;
    count[r] = (count[r] ?? 0) + 1;
  }
  const start = new Int32Array(nBins + 1);
  for (let r = 0; r < nBins; r++) start[r + 1] = (start[r] ?? 0) + (count[r] ?? 0);
  const fill = start.slice(0, nBins);
  const hourIdx = new Int32Array(n);
  for (let i = 0; i < n; i++) {
    const r = binOfHour[i] ?? 0;
    hourIdx[fill[r] ?? 0] = i;
    fill[r] = (fill[r] ?? 0) + 1;
  }
  return { t, w, count, start, hourIdx, binOfHour };
}

export function binsFor(index: SweepRecordIndex, withWind: boolean): Bins {
  if (withWind) return (index.byTemperatureAndWind ??= buildBins(index.hours, true));
  return (index.byTemperature ??= buildBins(index.hours, false));
}

/** The building's load and load conductance (with duct loss) in each bin. */
export interface BinLoads {
  bins: Bins;
  load: Float64Array;
  ua: Float64Array;
}

export function binLoads(building: Building, index: SweepRecordIndex, designWindMs: number): BinLoads {
  const bins = binsFor(index, building.airLeakage.mode === 'ela');
  const nBins = bins.t.length;
  const load = new Float64Array(nBins);
  const ua = new Float64Array(nBins);
  for (let b = 0; b < nBins; b++) {
    const recorded = bins.w[b] ?? NaN;
    const h = heatLoss(building, bins.t[b] ?? 0, Number.isNaN(recorded) ? designWindMs : recorded);
    load[b] = h.loadW;
    ua[b] = effectiveConductanceWPerK(h);
  }
  return { bins, load, ua };
}

export interface LoadDurationPoint {
  /** Hours per average qualifying year with a load at or above `loadW`. */
  hoursPerYear: number;
  loadW: number;
  /** Outdoor temperature of that load (the warmest bin at this load), °C. */
  outdoorC: number;
}

/**
 * The record's load-duration curve for a building: hourly loads in descending order against the
 * hours per average year at or above them, thinned to at most `maxPoints` points (the first and the
 * last always kept). Hours without load are left out.
 */
export function loadDuration(
  building: Building,
  index: SweepRecordIndex,
  designWindMs: number,
  maxPoints = 300,
): LoadDurationPoint[] {
  const { bins, load } = binLoads(building, index, designWindMs);
  const years = Math.max(1, index.hours.years.length);
  const order = Array.from(load.keys())
    .filter((b) => (load[b] ?? 0) > 0)
    .sort((a, b) => (load[b] ?? 0) - (load[a] ?? 0));
  const all: LoadDurationPoint[] = [];
  let hours = 0;
  for (const b of order) {
    hours += bins.count[b] ?? 0;
    all.push({ hoursPerYear: hours / years, loadW: load[b] ?? 0, outdoorC: bins.t[b] ?? 0 });
  }
  if (all.length <= maxPoints) return all;
  const step = (all.length - 1) / (maxPoints - 1);
  const thinned: LoadDurationPoint[] = [];
  for (let k = 0; k < maxPoints; k++) {
    const p = all[Math.round(k * step)];
    if (p) thinned.push(p);
  }
  return thinned;
}
