/**
 * Sweep step 4, hourly consequences of one installed option over the record: run-hours, purchased
 * energy with cycling losses, backup hours and energy, unmet hours, energy and degree-hours, and the
 * lowest indoor temperature from the single-capacitance walk with recovery and bridged gaps
 * (docs/methods.md#hourly, #cycling, #degree-hours, #indoor-temperature).
 *
 * `simulateNaive` steps every hour and is the reference; `simulateBinned` sums over the temperature
 * bins and walks in time order only from each unmet hour until the house is back at the set-point.
 * Pure: no I/O. SI units (W, W/K, °C, K, h, kWh).
 */
import type { Building } from '../building/building-schemas';
import { effectiveConductanceWPerK, heatLoss } from '../building/heat-loss';
import { capacityAt, type CapacityAt } from '../equipment/capacity';
import type { EquipmentOption } from '../equipment/equipment-schemas';
import type { BinLoads } from './sweep-bins';
import type { Hours } from './sweep-prepare';

/** Default cycling degradation coefficient of a single-stage heat pump (docs/methods.md#cycling). */
export const DEFAULT_HEAT_PUMP_CYCLING_DEGRADATION = 0.25;

/** The option's C_d: its own, or 0.25 for a heat pump and 0 for other kinds (docs/methods.md#cycling). */
export function cyclingDegradationOf(option: Pick<EquipmentOption, 'kind' | 'cyclingDegradation'>): number {
  return option.cyclingDegradation ?? (option.kind === 'heat-pump' ? DEFAULT_HEAT_PUMP_CYCLING_DEGRADATION : 0);
}

/**
 * Part-load factor PLF = 1 − C_d·(1 − PLR) (docs/methods.md#cycling). A variable-capacity unit with
 * minimum output fraction m modulates without cycling loss above m, and cycles at its minimum output
 * below it: PLF = 1 − C_d·(1 − PLR/m). A single-stage unit has m = 1.
 */
export function partLoadFactor(plr: number, cd: number, minOutputFraction = 1): number {
  if (!(plr < minOutputFraction)) return 1;
  return 1 - cd * (1 - plr / minOutputFraction);
}

/** Steady indoor temperature with capacity Q and gains G against conductance UA: T_out + (Q + G)/UA (docs/methods.md#indoor-temperature). */
export function steadyIndoorC(outdoorC: number, capacityW: number, gainsW: number, uaWPerK: number): number {
  return outdoorC + (capacityW + gainsW) / uaWPerK;
}

/** One step of the single-capacitance model: T_ss + (T − T_ss)·e^(−Δt/τ) (docs/methods.md#indoor-temperature). */
export function droopStep(indoorC: number, steadyC: number, tauH: number, dtH = 1): number {
  return steadyC + (indoorC - steadyC) * Math.exp(-dtH / tauH);
}

/** Longest gap in a record, hours, across which the indoor temperature carries on (docs/methods.md#indoor-temperature). */
export const MAX_BRIDGED_GAP_H = 6;

/** Hour-based results of one option over the record. */
export interface OptionHours {
  energyKWhPerYear: number;
  runHoursPerYear: number;
  backupHoursPerYear: number;
  backupEnergyKWh: number;
  unmetHoursPerYear: number;
  unmetHoursWorstYear: number;
  unmetEnergyKWhPerYear: number;
  unmetDegreeHoursPerYear: number;
  lowestIndoorC: number;
}

/** Sums over hours (each hour, or a bin of `count` equal hours). */
export interface Sums {
  energyWh: number;
  run: number;
  backupHours: number;
  backupWh: number;
  unmetWh: number;
  degreeHours: number;
}

export const newSums = (): Sums => ({ energyWh: 0, run: 0, backupHours: 0, backupWh: 0, unmetWh: 0, degreeHours: 0 });

/** What the sweep needs of an option besides its capacity. */
export interface OptionTraits {
  isPump: boolean;
  cd: number;
  minOutput: number;
}

export const traitsOf = (option: EquipmentOption): OptionTraits => ({
  isPump: option.kind === 'heat-pump',
  cd: cyclingDegradationOf(option),
  minOutput: option.minOutputFraction ?? 1,
});

/**
 * Adds `count` hours of load `l` (W) met by capacity `c` to the sums (docs/methods.md#hourly):
 * equivalent full-load hours of the main source, purchased energy with the part-load factor, backup
 * hours and heat, and the shortfall of the whole unit.
 */
export function addHours(sums: Sums, traits: OptionTraits, l: number, c: CapacityAt, ua: number, count: number): void {
  const main = traits.isPump ? c.compressorW : c.totalW;
  if (main > 0 && l > 0) {
    const plr = Math.min(1, l / main);
    sums.run += count * plr;
    sums.energyWh += (count * Math.min(l, main)) / (c.cop * partLoadFactor(plr, traits.cd, traits.minOutput));
  }
  if (traits.isPump && l > main && c.backupW > 0) {
    const fromBackup = Math.min(l - main, c.backupW);
    sums.backupHours += count;
    sums.backupWh += count * fromBackup;
    sums.energyWh += count * fromBackup;
  }
  if (l > c.totalW) {
    sums.unmetWh += count * (l - c.totalW);
    sums.degreeHours += (count * (l - c.totalW)) / ua;
  }
}

export function summarise(nYears: number, sums: Sums, unmetByYear: Float64Array, lowestIndoorC: number): OptionHours {
  let unmet = 0;
  let worst = 0;
  for (const u of unmetByYear) {
    unmet += u;
    if (u > worst) worst = u;
  }
  const y = Math.max(1, nYears);
  return {
    energyKWhPerYear: sums.energyWh / 1000 / y,
    runHoursPerYear: sums.run / y,
    backupHoursPerYear: sums.backupHours / y,
    backupEnergyKWh: sums.backupWh / 1000 / y,
    unmetHoursPerYear: unmet / y,
    unmetHoursWorstYear: worst,
    unmetEnergyKWhPerYear: sums.unmetWh / 1000 / y,
    unmetDegreeHoursPerYear: sums.degreeHours / y,
    lowestIndoorC,
  };
}

/** The indoor temperature while it is below the set-point, and the lowest it has been. */
export interface IndoorState {
  c: number;
  lowest: number;
}

/** One hour of the single-capacitance model at full output; back at the set-point it stays there. */
export function stepIndoor(
  s: IndoorState,
  set: number,
  outdoorC: number,
  capacityW: number,
  gainsW: number,
  ua: number,
  decay: number,
): void {
  const steady = outdoorC + (capacityW + gainsW) / ua;
  const next = steady + (s.c - steady) * decay;
  if (next < s.lowest) s.lowest = next;
  s.c = next >= set ? set : next;
}

/**
 * Carries the indoor temperature across `missing` hours absent from the record, the outdoor
 * temperature interpolated linearly and the wind at its design value; a gap longer than
 * `MAX_BRIDGED_GAP_H` resets it to the set-point (docs/methods.md#indoor-temperature).
 */
export function bridgeGap(
  s: IndoorState,
  set: number,
  missing: number,
  fromC: number,
  toC: number,
  building: Building,
  option: EquipmentOption,
  designWindMs: number,
  decay: number,
): void {
  if (missing > MAX_BRIDGED_GAP_H || missing < 0) {
    s.c = set;
    return;
  }
  for (let k = 1; k <= missing && s.c < set; k++) {
    const t = fromC + ((toC - fromC) * k) / (missing + 1);
    stepIndoor(
      s,
      set,
      t,
      capacityAt(option, t).totalW,
      building.internalGainsW,
      effectiveConductanceWPerK(heatLoss(building, t, designWindMs)),
      decay,
    );
  }
}

/**
 * Reference simulation of one option: every hour with `heatLoss` and `capacityAt` called afresh,
 * and the indoor temperature stepped in every hour that is unmet or still recovering.
 */
export function simulateNaive(
  building: Building,
  option: EquipmentOption,
  hours: Hours,
  tauH: number,
  designWindMs: number,
): OptionHours {
  const set = building.indoorDesignC;
  const traits = traitsOf(option);
  const decay = Math.exp(-1 / tauH);
  const unmetByYear = new Float64Array(hours.years.length);
  const sums = newSums();
  const indoor: IndoorState = { c: set, lowest: set };
  for (let i = 0; i < hours.n; i++) {
    const t = hours.outdoorC[i] ?? 0;
    const recorded = hours.windMs[i] ?? NaN;
    const w = Number.isNaN(recorded) ? designWindMs : recorded;
    if (i > 0 && indoor.c < set) {
      const missing = (hours.hourNumber[i] ?? 0) - (hours.hourNumber[i - 1] ?? 0) - 1;
      if (missing !== 0)
        bridgeGap(indoor, set, missing, hours.outdoorC[i - 1] ?? 0, t, building, option, designWindMs, decay);
    }
    const h = heatLoss(building, t, w);
    const ua = effectiveConductanceWPerK(h);
    const c = capacityAt(option, t);
    addHours(sums, traits, h.loadW, c, ua, 1);
    const unmet = h.loadW > c.totalW;
    if (unmet) unmetByYear[hours.yearIndex[i] ?? 0] = (unmetByYear[hours.yearIndex[i] ?? 0] ?? 0) + 1;
    if (unmet || indoor.c < set) stepIndoor(indoor, set, t, c.totalW, building.internalGainsW, ua, decay);
  }
  return summarise(hours.years.length, sums, unmetByYear, indoor.lowest);
}

/**
 * Hour-based figures of one option: sums over the bins, then a time-ordered walk from each unmet hour
 * until the house is back at the set-point (docs/methods.md#indoor-temperature).
 */
export function simulateBinned(
  building: Building,
  option: EquipmentOption,
  hours: Hours,
  loads: BinLoads,
  tauH: number,
  designWindMs: number,
): OptionHours {
  const { bins, load, ua } = loads;
  const nBins = bins.t.length;
  const traits = traitsOf(option);
  let c = capacityAt(option, 0);
  let lastT = NaN;
  const sums = newSums();
  const unmetBins: number[] = [];
  let unmetCount = 0;
  const capByBin = new Float64Array(nBins);
  for (let b = 0; b < nBins; b++) {
    const t = bins.t[b] ?? 0;
    if (traits.isPump && t !== lastT) {
      c = capacityAt(option, t);
      lastT = t;
    }
    const count = bins.count[b] ?? 0;
    const l = load[b] ?? 0;
    capByBin[b] = c.totalW;
    addHours(sums, traits, l, c, ua[b] ?? 1, count);
    if (l > c.totalW) {
      unmetBins.push(b);
      unmetCount += count;
    }
  }

  // The unmet hours in time order (hour indices, exact in a double), for the per-year counts and
  // the starts of the indoor-temperature walks.
  const unmetHours = new Float64Array(unmetCount);
  let k = 0;
  for (const b of unmetBins) {
    for (let j = bins.start[b] ?? 0; j < (bins.start[b + 1] ?? 0); j++) unmetHours[k++] = bins.hourIdx[j] ?? 0;
  }
  unmetHours.sort();
  const unmetByYear = new Float64Array(hours.years.length);
  const set = building.indoorDesignC;
  const gains = building.internalGainsW;
  const decay = Math.exp(-1 / tauH);
  const indoor: IndoorState = { c: set, lowest: set };
  let walkedTo = -1;
  for (const i of unmetHours) {
    const yi = hours.yearIndex[i] ?? 0;
    unmetByYear[yi] = (unmetByYear[yi] ?? 0) + 1;
    if (i <= walkedTo) continue;
    // A walk starts at the set-point: the previous one ended there (or at a long gap).
    indoor.c = set;
    let j = i;
    for (;;) {
      const b = bins.binOfHour[j] ?? 0;
      stepIndoor(indoor, set, hours.outdoorC[j] ?? 0, capByBin[b] ?? 0, gains, ua[b] ?? 1, decay);
      walkedTo = j;
      if (indoor.c >= set || j + 1 >= hours.n) break;
      const missing = (hours.hourNumber[j + 1] ?? 0) - (hours.hourNumber[j] ?? 0) - 1;
      if (missing !== 0) {
        bridgeGap(
          indoor,
          set,
          missing,
          hours.outdoorC[j] ?? 0,
          hours.outdoorC[j + 1] ?? 0,
          building,
          option,
          designWindMs,
          decay,
        );
        if (indoor.c >= set) break;
      }
      j++;
    }
  }
  return summarise(hours.years.length, sums, unmetByYear, indoor.lowest);
}
