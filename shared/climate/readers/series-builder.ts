/** Growable columnar storage used by the line parsers. */
import type { HourlySeries } from '../hourly-series';

export class SeriesBuilder {
  private capacity: number;
  private count = 0;
  private time: Float64Array;
  private dryBulbC: Float64Array;
  private dewPointC: Float64Array;
  private windSpeedMs: Float64Array;
  private stationPressureKpa: Float64Array;

  constructor(initialCapacity = 8784) {
    this.capacity = Math.max(16, initialCapacity);
    this.time = new Float64Array(this.capacity);
    this.dryBulbC = new Float64Array(this.capacity);
    this.dewPointC = new Float64Array(this.capacity);
    this.windSpeedMs = new Float64Array(this.capacity);
    this.stationPressureKpa = new Float64Array(this.capacity);
  }

  get length(): number {
    return this.count;
  }

  /** Appends one row (NaN = missing). */
  push(time: number, dryBulbC: number, dewPointC: number, windSpeedMs: number, stationPressureKpa: number): void {
    if (this.count === this.capacity) this.grow();
    const i = this.count++;
    this.time[i] = time;
    this.dryBulbC[i] = dryBulbC;
    this.dewPointC[i] = dewPointC;
    this.windSpeedMs[i] = windSpeedMs;
    this.stationPressureKpa[i] = stationPressureKpa;
  }

  /** The rows pushed so far, as a series of exactly that length. */
  build(): HourlySeries {
    const n = this.count;
    return {
      time: this.time.slice(0, n),
      dryBulbC: this.dryBulbC.slice(0, n),
      dewPointC: this.dewPointC.slice(0, n),
      windSpeedMs: this.windSpeedMs.slice(0, n),
      stationPressureKpa: this.stationPressureKpa.slice(0, n),
    };
  }

  private grow(): void {
    this.capacity *= 2;
    const enlarge = (a: Float64Array): Float64Array => {
      const b = new Float64Array(this.capacity);
      b.set(a);
      return b;
    };
    this.time = enlarge(this.time);
    this.dryBulbC = enlarge(this.dryBulbC);
    this.dewPointC = enlarge(this.dewPointC);
    this.windSpeedMs = enlarge(this.windSpeedMs);
    this.stationPressureKpa = enlarge(this.stationPressureKpa);
  }
}
