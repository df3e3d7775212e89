/**
 * The sweep's methods against published formulas and closed-form worked examples
 * (docs/methods.md): NIST Handbook 135 present-value factors, replacement and residual value over
 * one study period; the part-load factor of the heat-pump rating procedure; heat pumps sized on the
 * compressor with backup hours and energy; the single-capacitance cool-down and recovery; gaps in
 * the record; selection across equipment families; warnings about short records. Tags: [C] computed
 * from the formula shown, [M] from memory (the docs say where no published value was found).
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import { buildingSchema, type Building } from '../../shared/building/building-schemas';
import { seriesFromRows } from '../../shared/climate/hourly-series';
import { equipmentOptionSchema, type EquipmentOptionInput } from '../../shared/equipment/equipment-schemas';
import type { EnergyPrices } from '../../shared/money/energy-prices';
import {
  modifiedUniformPresentValue,
  ownershipFactor,
  partLoadFactor,
  singlePresentValue,
  sweep,
  sweepNaive,
  uniformPresentValue,
  type SweepInput,
  type SweepOption,
  type SweepRecord,
  type SweepRow,
} from '../../shared/sweep/sweep';
import { assertClose } from './close-to';

const HOUR_MS = 3_600_000;
/** C = 30 MJ/K, UA = 250 W/K → τ = 33.333 h (docs/methods.md#indoor-temperature). */
const TAU_H = 30e6 / 250 / 3600;

const building = (extra: Partial<Building> = {}): Building => ({
  ...buildingSchema.parse({
    indoorDesignC: 21,
    conduction: { mode: 'ua', uaWPerK: 250 },
    airLeakage: { mode: 'ach', ach: 0, volumeM3: 100 },
    thermalMass: { mode: 'hours', timeConstantH: TAU_H },
  }),
  ...extra,
});

const option = (id: string, o: EquipmentOptionInput): SweepOption => ({ ...equipmentOptionSchema.parse(o), id });
const furnace = (id: string, outputW: number, installedPrice: string, lifeYears = 20): SweepOption =>
  option(id, { kind: 'furnace', label: id, fuel: 'gas', efficiency: 0.95, outputW, installedPrice, lifeYears });
/** A heat pump with the same capacity and COP at both rating points (flat below the coldest). */
const flatHeatPump = (
  id: string,
  compressorW: number,
  cop: number,
  backupW: number,
  installedPrice: string,
): SweepOption =>
  option(id, {
    kind: 'heat-pump',
    label: id,
    installedPrice,
    lifeYears: 15,
    capacity8_3W: compressorW,
    cop8_3: cop,
    capacityM8_3W: compressorW,
    copM8_3: cop,
    backupW,
  });

const prices: EnergyPrices = { currency: 'USD', electricityPerKwh: '0.15', gas: { unit: 'kWh', price: '0.05' } };

/** Hours of 2001 from 1 January, one temperature per block; a `null` temperature leaves the hours out of the record. */
function record(blocks: [hours: number, tC: number | null][]): SweepRecord {
  const time: number[] = [];
  const dryBulbC: number[] = [];
  let h = 0;
  for (const [count, t] of blocks) {
    for (let k = 0; k < count; k++, h++) {
      if (t === null) continue;
      time.push(Date.UTC(2001, 0, 1) + h * HOUR_MS);
      dryBulbC.push(t);
    }
  }
  return { series: seriesFromRows({ time, dryBulbC }), qualifyingYears: [2001] };
}

const rowOf = (rows: SweepRow[], label: string): SweepRow => {
  const row = rows.find((r) => r.label === label);
  assert.ok(row, `no row "${label}"`);
  return row;
};

const base = (over: Partial<SweepInput>): SweepInput => ({
  building: building(),
  options: [],
  prices,
  economics: { discountRatePct: 3 },
  designConditions: { heating: { db99: -3, db99_6: -3 } },
  designWindMs: 6.7,
  ...over,
});

describe('NIST Handbook 135 (Fuller & Petersen, 1995 ed.) present-value factors', () => {
  it('SPV, UPV and UPV* from the handbook formulas [C]', () => {
    assertClose(singlePresentValue(0.03, 10), 0.744094, 5e-7, 'SPV(3 %, 10) = 1/1.03^10, Handbook 135 [C]');
    assertClose(uniformPresentValue(0.03, 20), 14.87747, 5e-6, 'UPV(3 %, 20), Handbook 135 [C]');
    assertClose(modifiedUniformPresentValue(0.03, 0.01, 15), 12.86832, 5e-6, 'UPV*(3 %, 1 %, 15), Handbook 135 [C]');
    assertClose(modifiedUniformPresentValue(0.03, 0.02, 20), 18.08123, 5e-6, 'UPV*(3 %, 2 %, 20), Handbook 135 [C]');
    // With no escalation UPV* is UPV; with e = d every year counts in full.
    assertClose(
      modifiedUniformPresentValue(0.03, 0, 20),
      uniformPresentValue(0.03, 20),
      1e-12,
      'UPV*(d, 0, n) = UPV(d, n)',
    );
    assert.equal(modifiedUniformPresentValue(0.04, 0.04, 12), 12);
  });

  it('replacement and residual value over one study period: P 1000, life 15, N 20, d 3 % [C]', () => {
    // Handbook 135 structure: replacement at 15 y = 1000·SPV(3 %, 15) = 641.862; residual at 20 y
    // = 1000·(10/15)·SPV(3 %, 20) = 369.117 (straight line on the remaining 10 of 15 years).
    const f = ownershipFactor(0.03, 15, 20);
    assertClose(1000 * f.replacements, 641.862, 5e-4, 'replacement PV [C]');
    assertClose(1000 * f.residual, 369.117, 5e-4, 'residual PV [C]');
    assertClose(f.total, 1 + 0.641862 - 0.369117, 1e-6, 'ownership factor');
    // A life that divides the study period: replacement at 10 y, nothing left at 20 y.
    const even = ownershipFactor(0.03, 10, 20);
    assertClose(even.replacements, 0.744094, 5e-7, 'SPV(3 %, 10)');
    assert.equal(even.residual, 0);
  });

  it('a sweep row costs every option over the same study period', () => {
    const input = base({
      options: [furnace('F', 8000, '4000.00', 15)],
      economics: { discountRatePct: 3, studyPeriodYears: 20, energyEscalationPctPerYear: 2 },
      record: record([[10, 1]]),
    });
    const result = sweep(input);
    const r = rowOf(result.rows, '99 %');
    // Load 250 × 20 = 5000 W for 10 h = 50 kWh delivered, / 0.95 = 52.6316 kWh; × 0.05 = 2.631579 $.
    assertClose(r.annualEnergyKWh, 50 / 0.95, 1e-9, 'energy');
    const expected = 4000 * (1 + 0.641862 - 0.369117) + (50 / 0.95) * 0.05 * 18.08123;
    assertClose(Number(r.lifeCycleCost), expected, 0.01, 'LCC = P(1 + repl − residual) + A·UPV* [C]');
    assert.equal(result.studyPeriodYears, 20);
    assert.equal(result.energyEscalationPctPerYear, 2);
  });

  it('property: a longer study period with the same life never lowers the life-cycle cost', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 10 }),
        fc.integer({ min: -2, max: 6 }),
        fc.integer({ min: 1, max: 40 }),
        fc.integer({ min: 1, max: 50 }),
        fc.integer({ min: 0, max: 100_000 }),
        (dPct, ePct, life, n, annual) => {
          const lcc = (years: number) =>
            ownershipFactor(dPct / 100, life, years).total * 5000 +
            annual * modifiedUniformPresentValue(dPct / 100, ePct / 100, years);
          assert.ok(lcc(n + 1) >= lcc(n) - 1e-9, `LCC fell from ${lcc(n)} to ${lcc(n + 1)}`);
        },
      ),
      { numRuns: 300 },
    );
  });
});

describe('part-load factor (DOE 10 CFR 430 Subpart B, Appendix M; docs/methods.md#cycling)', () => {
  it('PLF = 1 − C_d·(1 − PLR) with the default C_d 0.25: PLF(0.25) 0.8125, PLF(0.5) 0.875, PLF(1) 1 [C, C_d M]', () => {
    assert.equal(partLoadFactor(0.25, 0.25), 0.8125);
    assert.equal(partLoadFactor(0.5, 0.25), 0.875);
    assert.equal(partLoadFactor(0.75, 0.25), 0.9375);
    assert.equal(partLoadFactor(1, 0.25), 1);
  });

  it('a variable-capacity unit modulates without loss above its minimum output and cycles below it', () => {
    assert.equal(partLoadFactor(0.5, 0.25, 0.3), 1);
    assert.equal(partLoadFactor(0.3, 0.25, 0.3), 1);
    // At PLR 0.15 with a 0.3 minimum the unit runs half the time at its minimum: 1 − 0.25·0.5.
    assert.equal(partLoadFactor(0.15, 0.25, 0.3), 0.875);
  });

  it('property: a larger C_d never lowers the energy', () => {
    fc.assert(
      fc.property(
        fc.integer({ min: 0, max: 49 }),
        fc.integer({ min: 1, max: 50 }),
        fc.array(
          fc.integer({ min: -300, max: 150 }).map((t) => t / 10),
          { minLength: 1, maxLength: 40 },
        ),
        fc.boolean(),
        (cdLow, step, temps, asHeatPump) => {
          const cdHigh = Math.min(0.5, (cdLow + step) / 100);
          const unit = (cd: number) =>
            asHeatPump
              ? { ...flatHeatPump('U', 7000, 2.8, 4000, '9000.00'), cyclingDegradation: cd }
              : { ...furnace('U', 12000, '4000.00'), cyclingDegradation: cd };
          const energy = (cd: number) =>
            rowOf(
              sweep(
                base({ options: [unit(cd)], record: record(temps.map((t) => [1, t])), heatPumpSizing: 'with-backup' }),
              ).rows,
              '99 %',
            ).annualEnergyKWh ?? NaN;
          assert.ok(energy(cdHigh) >= energy(cdLow / 100) - 1e-9);
        },
      ),
      { numRuns: 200 },
    );
  });
});

describe('heat pumps sized on the compressor, with backup hours and energy', () => {
  // Loads L = 250 × (21 − T): 1 °C → 5000 W; −11 °C → 8000 W; −23 °C → 11 000 W.
  const hp = flatHeatPump('HP', 6000, 3, 3000, '12000.00');
  // 2 kW compressor with a 5 kW strip: 7 kW together, less than the real heat pump's 9 kW.
  const strip = flatHeatPump('STRIP', 2000, 3, 5000, '8000.00');
  const input = base({
    options: [hp, strip],
    record: record([
      [10, 1],
      [4, -11],
      [2, -23],
    ]),
  });

  it('the compressor must cover the design load (default); with backup the smaller total wins', () => {
    // 99 % −3 °C: D = 6000 W. Compressor rule: HP's 6000 W covers, STRIP's 2000 W does not.
    const compressor = sweep(input);
    const r = rowOf(compressor.rows, '99 %');
    assert.equal(compressor.heatPumpSizing, 'compressor');
    assert.equal(r.selectedOptionId, 'HP');
    assert.equal(r.compressorAtDesignW, 6000);
    assert.equal(r.capacityAtDesignW, 9000);
    const withBackup = rowOf(sweep({ ...input, heatPumpSizing: 'with-backup' }).rows, '99 %');
    assert.equal(withBackup.selectedOptionId, 'STRIP');
  });

  it('equivalent full-load hours of the compressor, backup hours and energy, cycling losses, by hand [C]', () => {
    const r = rowOf(sweep(input).rows, '99 %');
    // Run-hours Σ min(1, L/Q_hp): 10 × 5/6 + 4 + 2 = 14.3333 h.
    assertClose(r.runHoursPerYear, 10 * (5 / 6) + 6, 1e-9, 'equivalent full-load hours');
    // Backup runs whenever L > 6000 W: 4 h giving 2000 W and 2 h giving its full 3000 W → 14 kWh.
    assert.equal(r.backupHoursPerYear, 6);
    assertClose(r.backupEnergyKWh, 14, 1e-9, 'backup energy');
    // Unmet only where L > 9000 W: the 2 h at −23 °C.
    assert.equal(r.unmetHoursPerYear, 2);
    // Energy: 1 °C, PLR 5/6, PLF = 1 − 0.25·(1/6) = 0.958333: 10 × 5000/(3 × 0.958333) Wh;
    // −11 and −23 °C: compressor at full output 6 × 2000 Wh; backup 14 000 Wh.
    const expected = (10 * 5000) / (3 * (1 - 0.25 / 6)) + 6 * 2000 + 14000;
    assertClose(r.annualEnergyKWh, expected / 1000, 1e-9, 'energy with cycling losses');
    // Without cycling losses the energy is lower: the part-load factor is what makes the difference.
    const noCycling = rowOf(sweep({ ...input, options: [{ ...hp, cyclingDegradation: 0 }, strip] }).rows, '99 %');
    assertClose(noCycling.annualEnergyKWh, ((10 * 5000) / 3 + 26000) / 1000, 1e-9, 'energy without cycling losses');
    assert.ok((r.annualEnergyKWh ?? 0) > (noCycling.annualEnergyKWh ?? 0));
  });

  it('the naive sweep agrees', () => {
    for (const heatPumpSizing of ['compressor', 'with-backup'] as const) {
      const fast = sweep({ ...input, heatPumpSizing }).rows;
      const naive = sweepNaive({ ...input, heatPumpSizing }).rows;
      assert.deepEqual(
        fast.map((r) => [r.selectedOptionId, r.backupHoursPerYear, r.lifeCycleCost]),
        naive.map((r) => [r.selectedOptionId, r.backupHoursPerYear, r.lifeCycleCost]),
      );
    }
  });
});

describe('indoor temperature: cool-down and recovery, closed form (docs/methods.md#indoor-temperature)', () => {
  // A 10 kW furnace against UA 250 W/K, τ 33.333 h. At −25 °C it falls towards T_ss = −25 + 40 = 15 °C;
  // at −15 °C the load is 9000 W and it recovers towards T_ss = −15 + 40 = 25 °C.
  const e = (h: number) => Math.exp(-h / TAU_H);
  const t1 = 15 + 6 * e(6); // 20.0116 °C after 6 h
  const run = (blocks: [number, number | null][]) =>
    rowOf(sweep(base({ options: [furnace('F10', 10000, '4000.00')], record: record(blocks) })).rows, '99 %');

  it('a second cold spell three hours after the first starts from where recovery got to', () => {
    const t2 = 25 - (25 - t1) * e(3); // 20.4410 °C: 3 h of recovery
    const t3 = 15 + (t2 - 15) * e(6); // 19.5447 °C
    assertClose(t3, 19.54468, 1e-5, 'closed form [C]');
    const r = run([
      [6, -25],
      [3, -15],
      [6, -25],
    ]);
    assertClose(r.lowestIndoorC, t3, 1e-9, 'lowest indoor temperature');
    assertClose(r.worstDropK, 21 - t3, 1e-9, 'worst drop');
    assert.equal(r.worstSagC, r.worstDropK);
    // Back at the set-point after τ·ln((25 − T1)/(25 − 21)) = 7.36 h of recovery: a gap of 8 h resets.
    assertClose(TAU_H * Math.log((25 - t1) / 4), 7.3606, 1e-4, 'recovery time [C]');
    const apart = run([
      [6, -25],
      [8, -15],
      [6, -25],
    ]);
    assertClose(apart.lowestIndoorC, t1, 1e-9, 'recovered before the second spell');
  });

  it('a gap of up to 6 hours carries the state with the outdoor temperature interpolated; a longer one resets', () => {
    // 6 h, 3 missing hours (interpolated −25 °C), 6 h: 15 hours of cool-down.
    const bridged = run([
      [6, -25],
      [3, null],
      [6, -25],
    ]);
    assertClose(bridged.lowestIndoorC, 15 + 6 * e(15), 1e-9, 'bridged gap [C]');
    assertClose(bridged.lowestIndoorC, 18.82577, 1e-5, 'bridged gap, value');
    const reset = run([
      [6, -25],
      [7, null],
      [6, -25],
    ]);
    assertClose(reset.lowestIndoorC, t1, 1e-9, 'a 7-hour gap restarts at the set-point');
  });
});

describe('selection across equipment families', () => {
  it('picks the lowest life-cycle cost among the options that cover the load, and says so', () => {
    // Furnace 7 kW at 3000 $ on gas against a heat pump that covers −3 °C; 200 h at 1 °C.
    const furnaceOption = furnace('GAS', 7000, '3000.00');
    const pump = flatHeatPump('HP', 6500, 3, 0, '9000.00');
    const input = base({ options: [pump, furnaceOption], record: record([[200, 1]]) });
    const result = sweep(input);
    const r = rowOf(result.rows, '99 %');
    assert.equal(result.selectionRule, 'lowest-life-cycle-cost');
    assert.ok(result.warnings.some((w) => w.code === 'mixed-families'));
    // The heat pump is smaller (6.5 kW) but dearer over 20 years; the furnace is selected.
    const lccOf = (o: SweepOption) => Number(rowOf(sweep({ ...input, options: [o] }).rows, '99 %').lifeCycleCost);
    assert.ok(lccOf(furnaceOption) < lccOf(pump));
    assert.equal(r.selectedOptionId, 'GAS');
  });

  it('within one family the smallest capacity that covers the load is installed', () => {
    const result = sweep(
      base({
        options: [furnace('BIG', 12000, '3500.00'), furnace('SMALL', 7000, '3900.00')],
        record: record([[5, 1]]),
      }),
    );
    assert.equal(result.selectionRule, 'smallest-capacity');
    assert.equal(rowOf(result.rows, '99 %').selectedOptionId, 'SMALL');
  });

  it('property: with mixed families the selected option never costs more over the study period than another that covers the load', () => {
    fc.assert(
      fc.property(
        fc.array(
          fc.record({
            pump: fc.boolean(),
            w: fc.integer({ min: 3000, max: 15000 }),
            price: fc.integer({ min: 2000, max: 15000 }),
          }),
          { minLength: 2, maxLength: 5 },
        ),
        fc.array(
          fc.integer({ min: -250, max: 100 }).map((t) => t / 10),
          { minLength: 1, maxLength: 30 },
        ),
        (specs, temps) => {
          fc.pre(specs.some((s) => s.pump) && specs.some((s) => !s.pump));
          const options = specs.map((s, i) =>
            s.pump ? flatHeatPump(`o${i}`, s.w, 2.5, 2000, `${s.price}.00`) : furnace(`o${i}`, s.w, `${s.price}.00`),
          );
          const input = base({ options, record: record(temps.map((t) => [1, t])) });
          for (const row of sweep(input).rows) {
            if (row.selectedOptionId === null) continue;
            for (const o of options) {
              const alone = rowOf(sweep({ ...input, options: [o] }).rows, row.label);
              if (alone.selectedOptionId === null) continue;
              assert.ok(
                Number(row.lifeCycleCost) <= Number(alone.lifeCycleCost) + 1e-9,
                `${row.label}: ${o.id} is cheaper`,
              );
            }
          }
        },
      ),
      { numRuns: 40 },
    );
  });
});

describe('warnings about the record', () => {
  const values = {
    heating: { db99: -3, db99_6: -5 },
    extremeMin: { mean: -10, returnPeriod: { '5': -12, '10': -13, '20': -14, '50': -16 } },
  };

  it('a one-year record: short, return periods unreliable, the 50-year row a rough estimate; rows marked', () => {
    const result = sweep(
      base({ options: [furnace('F', 12000, '4000.00')], designConditions: values, record: record([[5, 1]]) }),
    );
    const codes = result.warnings.map((w) => w.code).sort();
    assert.deepEqual(codes, ['fifty-year-short-record', 'return-periods-unreliable', 'short-record']);
    assert.match(rowOf(result.rows, '10-year').reliabilityNote ?? '', /fewer than 10/);
    assert.match(rowOf(result.rows, '50-year').reliabilityNote ?? '', /fewer than 20/);
    assert.equal(rowOf(result.rows, '99 %').reliabilityNote, null);
  });

  it('a record without return periods says the ladder stops early; published values alone warn of nothing', () => {
    const short = sweep(base({ options: [furnace('F', 12000, '4000.00')], record: record([[5, 1]]) }));
    assert.ok(short.warnings.some((w) => w.code === 'no-return-periods'));
    assert.deepEqual(
      sweep(base({ options: [furnace('F', 12000, '4000.00')], designConditions: values, record: null })).warnings,
      [],
    );
  });
});
