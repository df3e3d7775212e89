/**
 * Design-temperature sweep against a small record worked by hand, docs/methods.md#hourly (unmet energy and
 * degree-hours), #indoor-temperature (single-capacitance indoor droop) and #life-cycle-cost (NIST Handbook 135, Fuller &
 * Petersen, 1995 ed., uniform present value). Tags: [S] confirmed in a source, [M] from memory,
 * [C] computed from the formula shown.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { buildingSchema, type Building } from '../../shared/building/building-schemas';
import { seriesFromRows } from '../../shared/climate/hourly-series';
import { equipmentOptionSchema, type EquipmentOptionInput } from '../../shared/equipment/equipment-schemas';
import type { EnergyPrices } from '../../shared/money/energy-prices';
import {
  designLadder,
  droopStep,
  steadyIndoorC,
  sweep,
  sweepNaive,
  uniformPresentValue,
  type SweepInput,
  type SweepOption,
  type SweepRecord,
  type SweepRow,
} from '../../shared/sweep/sweep';
import { assertClose, assertDeepClose } from './close-to';

const HOUR_MS = 3_600_000;
/** C = 30 MJ/K, UA = 250 W/K → τ = C/UA = 120 000 s = 33.333 h (docs/methods.md#indoor-temperature check [C]). */
const TAU_H = 30e6 / 250 / 3600;

/** UA 250 W/K, no air leakage, set-point 21 °C, no gains, duct loss or safety factor. */
const building = (): Building =>
  buildingSchema.parse({
    indoorDesignC: 21,
    conduction: { mode: 'ua', uaWPerK: 250 },
    airLeakage: { mode: 'ach', ach: 0, volumeM3: 100 },
    thermalMass: { mode: 'hours', timeConstantH: TAU_H },
  });

const option = (id: string, o: EquipmentOptionInput): SweepOption => ({ ...equipmentOptionSchema.parse(o), id });
const furnace = (id: string, outputW: number, efficiency: number, installedPrice: string): SweepOption =>
  option(id, { kind: 'furnace', label: id, fuel: 'gas', efficiency, outputW, installedPrice, lifeYears: 20 });

const prices: EnergyPrices = { currency: 'USD', electricityPerKwh: '0.15', gas: { unit: 'kWh', price: '0.05' } };

/** Consecutive hours from 1 January of a year, one temperature per block. */
function record(years: Record<number, [hours: number, tC: number][]>): SweepRecord {
  const time: number[] = [];
  const dryBulbC: number[] = [];
  for (const [year, blocks] of Object.entries(years)) {
    let h = 0;
    for (const [count, t] of blocks) {
      for (let k = 0; k < count; k++) {
        time.push(Date.UTC(Number(year), 0, 1) + h * HOUR_MS);
        dryBulbC.push(t);
        h++;
      }
    }
  }
  return { series: seriesFromRows({ time, dryBulbC }), qualifyingYears: Object.keys(years).map(Number) };
}

const rowOf = (rows: SweepRow[], label: string): SweepRow => {
  const row = rows.find((r) => r.label === label);
  assert.ok(row, `no row "${label}"`);
  return row;
};

describe('sweep: a small record worked by hand', () => {
  // Loads L = 250 W/K × (21 − T): 1 °C → 5000 W; −4 °C → 6250 W; 5 °C → 4000 W;
  // −19 °C → 10 000 W; −23 °C → 11 000 W.
  // 2001: 20 h at 1 °C, then 3 h at −19 °C. 2002: 10 h at −4 °C, 4 h at −23 °C, 6 h at 5 °C.
  const input: SweepInput = {
    building: building(),
    options: [
      furnace('A', 6000, 0.9, '3000.00'),
      furnace('B', 8000, 0.95, '3500.00'),
      furnace('C', 10000, 0.95, '4200.00'),
    ],
    prices,
    economics: { discountRatePct: 3 },
    designConditions: {
      heating: { db99: -5, db99_6: -8 },
      extremeMin: { mean: -15, returnPeriod: { '5': -18, '10': -20, '20': null, '50': -25 } },
    },
    designWindMs: 6.7,
    record: record({
      2001: [
        [20, 1],
        [3, -19],
      ],
      2002: [
        [10, -4],
        [4, -23],
        [6, 5],
      ],
    }),
  };
  const result = sweep(input);

  it('builds the ladder: named values present, and a 0.5 °C grid between −5 and −25 °C', () => {
    const named = result.rows.filter((r) => !r.isGrid).map((r) => r.label);
    assert.deepEqual(named, ['99 %', '99.6 %', 'Extreme mean', '5-year', '10-year', '50-year']);
    // −5 … −25 °C every 0.5 K is 41 temperatures; 6 of them are named values → 35 grid rows.
    assert.equal(result.rows.filter((r) => r.isGrid).length, 35);
    assert.equal(result.rows.length, 41);
    for (let i = 1; i < result.rows.length; i++) {
      assert.ok((result.rows[i]?.designC ?? 0) < (result.rows[i - 1]?.designC ?? 0), 'mildest first');
    }
  });

  it('99 %: design load 6500 W selects the 8 kW unit B, hour figures by hand', () => {
    const r = rowOf(result.rows, '99 %');
    assertClose(r.designLoadW, 6500, 1e-9, 'D = 250 × 26 [C]');
    assert.equal(r.selectedOptionId, 'B');
    assert.equal(r.capacityAtDesignW, 8000);
    assert.equal(r.installedPrice, '3500.00');
    // Delivered min(L, 8000): 2001 20×5000 + 3×8000 = 124 000 Wh; 2002 10×6250 + 4×8000 + 6×4000
    // = 118 500 Wh. Purchased (242 500 / 0.95) / 2 years = 127.6316 kWh per year [C].
    assertClose(r.annualEnergyKWh, 242_500 / 0.95 / 2 / 1000, 1e-9, 'annual energy');
    // Run-hours: 2001 20×0.625 + 3 = 15.5; 2002 10×0.78125 + 4 + 6×0.5 = 14.8125 → 15.15625 [C].
    assertClose(r.runHoursPerYear, 15.15625, 1e-9, 'run-hours');
    // Unmet: 3 h (2001) and 4 h (2002) → 3.5 per year, worst year 4 [C].
    assert.equal(r.unmetHoursPerYear, 3.5);
    assert.equal(r.unmetHoursWorstYear, 4);
    // Unmet energy: 3 × 2000 + 4 × 3000 = 18 000 Wh → 9 kWh per year;
    // degree-hours 3 × 8 + 4 × 12 = 72 K·h → 36 per year (docs/methods.md#hourly identity [C]).
    assertClose(r.unmetEnergyKWhPerYear, 9, 1e-9, 'unmet energy');
    assertClose(r.unmetDegreeHoursPerYear, 36, 1e-9, 'unmet degree-hours');
    // Sag (docs/methods.md#indoor-temperature): 2002 at −23 °C, T_ss = −23 + 8000/250 = 9 °C; after 4 h
    // T = 9 + 12·e^(−4/33.333) = 19.6430 → 1.35695 K (2001: 13 + 8·e^(−0.09) → 0.68855 K) [C].
    assertClose(r.worstSagC, 1.3569548, 1e-6, 'worst sag');
    // Cost: 0.05 $/kWh × 127.6316 kWh = 6.38 $; LCC = 3500 + UPV(3 %, 20) × 6.381579 = 3594.94 [C].
    assert.equal(r.annualCost, '6.38');
    assert.equal(r.lifeCycleCost, '3594.94');
    assert.equal(r.unavailableReason, null);
  });

  it('extreme mean −15 °C: 9000 W selects the 10 kW unit C', () => {
    const r = rowOf(result.rows, 'Extreme mean');
    assert.equal(r.selectedOptionId, 'C');
    assert.equal(r.installedPrice, '4200.00');
    // Only the 2002 −23 °C hours are unmet: 4 h × 1000 W / 250 W/K = 16 K·h → 8 per year [C].
    assert.equal(r.unmetHoursPerYear, 2);
    assert.equal(r.unmetHoursWorstYear, 4);
    assertClose(r.unmetDegreeHoursPerYear, 8, 1e-9, 'degree-hours');
    // Delivered 130 000 + 126 500 = 256 500 Wh / 0.95 / 2 = 135 kWh; 0.05 × 135 = 6.75 $ [C].
    assertClose(r.annualEnergyKWh, 135, 1e-9, 'energy');
    assert.equal(r.annualCost, '6.75');
    // Run-hours: (20×0.5 + 3 + 10×0.625 + 4 + 6×0.4) / 2 = 12.825 [C].
    assertClose(r.runHoursPerYear, 12.825, 1e-9, 'run-hours');
    // T_ss = −23 + 40 = 17 °C; 17 + 4·e^(−0.12) = 20.5477 → sag 0.45232 K [C].
    assertClose(r.worstSagC, 0.4523183, 1e-6, 'sag');
    // 4200 + 14.877475 × 6.75 = 4300.42 [C].
    assert.equal(r.lifeCycleCost, '4300.42');
  });

  it('a load no option can meet is reported, not hidden; the 10 kW unit still covers −19 °C exactly', () => {
    const r50 = rowOf(result.rows, '50-year');
    assert.equal(r50.selectedOptionId, null);
    assert.match(r50.selectionReason ?? '', /No option delivers the design load of 11500 W/);
    assert.equal(r50.annualEnergyKWh, null);
    assert.equal(rowOf(result.rows, '10-year').selectedOptionId, null); // 10 250 W > 10 000 W
    assert.equal(rowOf(result.rows, '-19.5 °C').selectedOptionId, null); // 10 125 W
    assert.equal(rowOf(result.rows, '-19 °C').selectedOptionId, 'C'); // 10 000 W ≥ 10 000 W
  });

  it('the naive sweep gives the same rows', () => {
    assertDeepClose(sweepNaive(input).rows, result.rows, 1e-9);
  });

  it('without a record: capacity and price, hour figures null with a reason', () => {
    const r = rowOf(sweep({ ...input, record: null }).rows, '99 %');
    assert.equal(r.selectedOptionId, 'B');
    assert.equal(r.installedPrice, '3500.00');
    assertClose(r.designLoadW, 6500, 1e-9, 'design load');
    assert.equal(r.annualEnergyKWh, null);
    assert.equal(r.unmetHoursPerYear, null);
    assert.equal(r.lifeCycleCost, null);
    assert.match(r.unavailableReason ?? '', /hourly record/);
  });

  it('ties in capacity go to the lower price; a heat pump counts its backup', () => {
    const hp = option('HP', {
      kind: 'heat-pump',
      label: 'HP',
      installedPrice: '9000.00',
      lifeYears: 15,
      capacity8_3W: 10000,
      cop8_3: 3.5,
      capacityM8_3W: 6000,
      copM8_3: 2.3,
      backupW: 2000,
    });
    const rows = sweep({
      ...input,
      options: [furnace('X', 8000, 0.95, '3600.00'), furnace('Y', 8000, 0.95, '3400.00'), hp],
    }).rows;
    // 99.6 %: −8 °C → D = 7250 W. Heat pump at −8 °C on the line 10 kW (8.33 °C) → 6 kW (−8.33 °C):
    // 10 000 − 4000 × 0.98 = 6080 W, + 2000 W backup = 8080 W ≥ 7250 W (docs/methods.md#heat-pump-capacity [C]); the
    // furnaces' 8000 W is smaller, and Y is cheaper than X.
    assert.equal(rowOf(rows, '99.6 %').selectedOptionId, 'Y');
  });
});

describe('docs/methods.md#hourly, #indoor-temperature checks', () => {
  it('hour at −20 °C with 6 kW against UA 250 W/K: 4.25 kWh and 17.0 K·h unmet [C]', () => {
    // docs/methods.md#hourly check [C]: L = 0.25 × 41 = 10.25 kW; unmet 4.25 kWh; 4250 / 250 = 17.0 K·h.
    const rows = sweep({
      building: building(),
      options: [furnace('F6', 6000, 0.95, '3000.00')],
      prices,
      economics: { discountRatePct: 3 },
      designConditions: { heating: { db99: -3, db99_6: -3 } }, // D = 250 × 24 = 6000 W
      designWindMs: 6.7,
      record: record({ 2001: [[1, -20]] }),
    }).rows;
    const r = rowOf(rows, '99 %');
    assert.equal(r.selectedOptionId, 'F6');
    assertClose(r.unmetEnergyKWhPerYear, 4.25, 1e-9, 'unmet energy, docs/methods.md#hourly [C]');
    assertClose(r.unmetDegreeHoursPerYear, 17.0, 1e-9, 'unmet degree-hours, docs/methods.md#hourly [C]');
  });

  it('droop: τ 33.333 h, T_ss 15 °C, T0 21 °C → T(6 h) 20.012, T(24 h) 17.921 °C [C]', () => {
    assertClose(TAU_H, 33.333, 5e-4, 'τ = 30 MJ/K / 250 W/K, docs/methods.md#indoor-temperature [C]');
    const tss = steadyIndoorC(-25, 10000, 0, 250);
    assertClose(tss, 15, 1e-12, 'T_ss = −25 + 10 000/250, docs/methods.md#indoor-temperature [C]');
    let t = 21;
    const path: number[] = [];
    for (let k = 1; k <= 24; k++) path.push((t = droopStep(t, tss, TAU_H)));
    assertClose(path[0], 20.823, 5e-4, 'T(1 h), docs/methods.md#indoor-temperature [C]');
    assertClose(path[5], 20.012, 5e-4, 'T(6 h), docs/methods.md#indoor-temperature [C]');
    assertClose(path[11], 19.186, 5e-4, 'T(12 h), docs/methods.md#indoor-temperature [C]');
    assertClose(path[23], 17.921, 5e-4, 'T(24 h), docs/methods.md#indoor-temperature [C]');
  });

  it('the sweep reports the same droop over 24 h at −25 °C with a 10 kW unit: sag 21 − 17.921 K [C]', () => {
    const rows = sweep({
      building: building(),
      options: [furnace('F10', 10000, 0.95, '4000.00')],
      prices,
      economics: { discountRatePct: 3 },
      designConditions: { heating: { db99: -15, db99_6: -15 } },
      designWindMs: 6.7,
      record: record({ 2001: [[24, -25]] }),
    }).rows;
    const r = rowOf(rows, '99 %');
    assertClose(r.worstSagC, 21 - 17.921, 5e-4, 'sag after 24 h, docs/methods.md#indoor-temperature [C]');
    assert.equal(r.unmetHoursPerYear, 24);
  });
});

describe('NIST Handbook 135 (1995 ed.) uniform present value, docs/methods.md#life-cycle-cost', () => {
  it('UPV = ((1+d)^n − 1)/(d(1+d)^n)', () => {
    assertClose(uniformPresentValue(0.03, 15), 11.93794, 5e-6, 'UPV(3 %, 15) [C]');
    assertClose(uniformPresentValue(0.03, 20), 14.87747, 5e-6, 'UPV(3 %, 20) [C]');
    assertClose(uniformPresentValue(0.07, 15), 9.10791, 5e-6, 'UPV(7 %, 15) [C]');
    assert.equal(uniformPresentValue(0, 12), 12);
  });
});

describe('design ladder', () => {
  it('adds extra temperatures and skips missing return periods', () => {
    const ladder = designLadder({ heating: { db99: -10, db99_6: -12 } }, [-13.2]);
    assert.deepEqual(
      ladder.filter((r) => !r.isGrid).map((r) => [r.label, r.designC]),
      [
        ['99 %', -10],
        ['99.6 %', -12],
        ['-13.2 °C', -13.2],
      ],
    );
    // Grid −10 … −13 every 0.5 K less the named −10 and −12: −10.5, −11, −11.5, −12.5, −13.
    assert.deepEqual(
      ladder.filter((r) => r.isGrid).map((r) => r.designC),
      [-10.5, -11, -11.5, -12.5, -13],
    );
  });
});
