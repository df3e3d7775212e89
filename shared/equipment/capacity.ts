/**
 * Heating capacity of an equipment option at an outdoor temperature, and the balance point where a
 * heat pump's capacity meets the building's load (docs/methods.md#equipment).
 *
 * Heat pumps: capacity Q and electric input P are interpolated linearly between the rating points
 * (8.3 °C / 47 °F, −8.3 °C / 17 °F and optionally −15 °C / 5 °F), separately, and COP = Q/P
 * (docs/methods.md#heat-pump-capacity, DOE/AHRI practice [M]). Above 8.3 °C the 8.3 → −8.3 °C line continues. Below the
 * coldest rating point capacity and COP are held flat unless the option says `extrapolate: true`
 * (then the coldest segment continues, floored at 0 capacity).
 */
import type { Building } from '../building/building-schemas';
import { heatLoss } from '../building/heat-loss';
import { fahrenheitToCelsius } from '../units/units';
import type { EquipmentOption, FuelledOption, HeatPumpOption } from './equipment-schemas';

/**
 * Heat-pump rating temperatures, °C, exact conversions of the AHRI 210/240 / DOE Appendix M
 * outdoor dry-bulbs H1 47 °F, H2 35 °F, H3 17 °F and H4 5 °F (docs/methods.md#heat-pump-capacity); tables round them to
 * 8.3, 1.7, −8.3 and −15 °C.
 */
export const RATING_C = {
  h1: fahrenheitToCelsius(47),
  h2: fahrenheitToCelsius(35),
  h3: fahrenheitToCelsius(17),
  h4: fahrenheitToCelsius(5),
  /** Upper end of the frost/defrost band, 45 °F. */
  frostBandTop: fahrenheitToCelsius(45),
} as const;

/**
 * Default H2 (35 °F) point when no frost test was run (docs/methods.md#heat-pump-capacity, DOE test procedure [M]):
 * Q35 = 0.90·[Q17 + 0.6·(Q47 − Q17)], P35 = 0.985·[P17 + 0.6·(P47 − P17)].
 */
export const DEFAULT_DEFROST_CAPACITY_FACTOR = 0.9;
export const DEFAULT_DEFROST_POWER_FACTOR = 0.985;

export interface RatingPoint {
  tC: number;
  capacityW: number;
  powerW: number;
}

/** A heat pump's rating points, warmest first, with electric input P = Q / COP. */
export function ratingPoints(hp: HeatPumpOption): RatingPoint[] {
  const points: RatingPoint[] = [
    { tC: RATING_C.h1, capacityW: hp.capacity8_3W, powerW: hp.capacity8_3W / hp.cop8_3 },
    { tC: RATING_C.h3, capacityW: hp.capacityM8_3W, powerW: hp.capacityM8_3W / hp.copM8_3 },
  ];
  if (hp.capacityM15W !== undefined && hp.copM15 !== undefined) {
    points.push({ tC: RATING_C.h4, capacityW: hp.capacityM15W, powerW: hp.capacityM15W / hp.copM15 });
  }
  return points;
}

/** The derived H2 (35 °F) point of docs/methods.md#heat-pump-capacity from the 47 °F and 17 °F ratings. */
export function defaultH2Point(hp: HeatPumpOption): RatingPoint {
  const [p47, p17] = ratingPoints(hp) as [RatingPoint, RatingPoint];
  return {
    tC: RATING_C.h2,
    capacityW: DEFAULT_DEFROST_CAPACITY_FACTOR * (p17.capacityW + 0.6 * (p47.capacityW - p17.capacityW)),
    powerW: DEFAULT_DEFROST_POWER_FACTOR * (p17.powerW + 0.6 * (p47.powerW - p17.powerW)),
  };
}

function along(a: RatingPoint, b: RatingPoint, tC: number): { capacityW: number; powerW: number } {
  const f = (tC - a.tC) / (b.tC - a.tC);
  return { capacityW: a.capacityW + (b.capacityW - a.capacityW) * f, powerW: a.powerW + (b.powerW - a.powerW) * f };
}

export interface CompressorAt {
  /** Heat from the compressor, W. */
  capacityW: number;
  /** Electric input of the compressor, W. */
  powerW: number;
  /** capacity / power; 0 when the compressor is off. */
  cop: number;
}

/** Compressor capacity, input and COP of a heat pump at an outdoor temperature (°C). */
export function heatPumpAt(hp: HeatPumpOption, outdoorC: number): CompressorAt {
  if (hp.cutoutC !== undefined && outdoorC < hp.cutoutC) return { capacityW: 0, powerW: 0, cop: 0 };
  const points = ratingPoints(hp);
  const [p1, p3] = points as [RatingPoint, RatingPoint];
  const p4 = points[2];
  let v: { capacityW: number; powerW: number };
  if (outdoorC >= p3.tC) {
    v =
      hp.defrostBand && outdoorC > p3.tC && outdoorC < RATING_C.frostBandTop
        ? along(p3, defaultH2Point(hp), outdoorC)
        : along(p1, p3, outdoorC);
  } else if (p4 === undefined) {
    v = hp.extrapolate ? along(p1, p3, outdoorC) : { capacityW: p3.capacityW, powerW: p3.powerW };
  } else if (outdoorC >= p4.tC || hp.extrapolate) {
    v = along(p3, p4, outdoorC);
  } else {
    v = { capacityW: p4.capacityW, powerW: p4.powerW };
  }
  const capacityW = Math.max(0, v.capacityW);
  const powerW = Math.max(0, v.powerW);
  if (capacityW === 0 || powerW === 0) return { capacityW: 0, powerW: 0, cop: 0 };
  return { capacityW, powerW, cop: capacityW / powerW };
}

/** Rated output of a furnace, boiler or electric heater, W: the output given, or input × efficiency (docs/methods.md#combustion-output). */
export function ratedOutputW(option: FuelledOption): number {
  if (option.outputW !== undefined) return option.outputW;
  if (option.inputW !== undefined) return option.inputW * option.efficiency;
  throw new Error(`"${option.label}" has neither an output nor an input rating`);
}

export interface CapacityAt {
  /** Heat-pump compressor heat, W (0 for other kinds). */
  compressorW: number;
  /** Heat-pump electric backup, W, at COP 1 (0 for other kinds). */
  backupW: number;
  /** All the heat the option can deliver at this temperature, W. */
  totalW: number;
  /**
   * Heat per unit of purchased energy of the main heat source: the compressor COP for a heat pump
   * (0 when it is off), the efficiency for a furnace or boiler, 1 for electric resistance.
   */
  cop: number;
  /** Purchased energy rate when delivering totalW, W (compressor + backup; or output / efficiency). */
  inputW: number;
}

/** What an option can deliver at an outdoor temperature (°C). */
export function capacityAt(option: EquipmentOption, outdoorC: number): CapacityAt {
  if (option.kind === 'heat-pump') {
    const c = heatPumpAt(option, outdoorC);
    return {
      compressorW: c.capacityW,
      backupW: option.backupW,
      totalW: c.capacityW + option.backupW,
      cop: c.cop,
      inputW: c.powerW + option.backupW,
    };
  }
  const outputW = ratedOutputW(option);
  return { compressorW: 0, backupW: 0, totalW: outputW, cop: option.efficiency, inputW: outputW / option.efficiency };
}

/** Heat the main source gives without backup, W: the compressor for a heat pump, the whole output otherwise. */
export function primaryCapacityW(option: EquipmentOption, outdoorC: number): number {
  const c = capacityAt(option, outdoorC);
  return option.kind === 'heat-pump' ? c.compressorW : c.totalW;
}

export interface BalancePointRange {
  /** Coldest outdoor temperature searched, °C (default −50). */
  minC?: number;
  /** Warmest outdoor temperature searched, °C (default the indoor design temperature). */
  maxC?: number;
}

/**
 * Thermal balance point, °C (docs/methods.md#balance-point): the outdoor temperature at which the heat-pump
 * compressor capacity (the whole output for other kinds; backup excluded) equals the building load
 * L(T) = max(0, heat loss − internal gains), without the safety factor. The warmest crossing in the
 * range is returned (below it the option cannot keep up without backup). Null when the capacity
 * stays above the load over the whole range, or below it over the whole range.
 */
export function balancePoint(
  option: EquipmentOption,
  building: Building,
  windMs: number,
  range: BalancePointRange = {},
): number | null {
  const minC = range.minC ?? -50;
  const maxC = range.maxC ?? building.indoorDesignC;
  const surplus = (tC: number) => primaryCapacityW(option, tC) - heatLoss(building, tC, windMs).loadW;
  if (!(maxC > minC)) return null;
  if (surplus(maxC) < 0) return null;
  const step = 0.25;
  let hi = maxC;
  while (hi > minC) {
    const lo = Math.max(minC, hi - step);
    if (surplus(lo) < 0) return bisect(surplus, lo, hi);
    hi = lo;
  }
  return null;
}

/** Root of f on [lo, hi] with f(lo) < 0 ≤ f(hi). */
function bisect(f: (x: number) => number, lo: number, hi: number): number {
  let a = lo;
  let b = hi;
  for (let i = 0; i < 80 && b - a > 1e-10; i++) {
    const m = (a + b) / 2;
    if (f(m) < 0) a = m;
    else b = m;
  }
  return (a + b) / 2;
}
