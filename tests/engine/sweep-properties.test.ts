/**
 * Properties of the design-temperature sweep on random buildings, equipment lists and records
 * (fast-check): a colder design temperature never selects a smaller unit, never raises the unmet
 * hours and never lowers the installed price; a unit larger than the coldest hour's load leaves no
 * unmet hours; the fast sweep gives the naive sweep's figures. Formulas: docs/methods.md#hourly, #indoor-temperature, #life-cycle-cost.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import { buildingSchema, type Building, type BuildingInput } from '../../shared/building/building-schemas';
import { heatLoss } from '../../shared/building/heat-loss';
import { seriesFromRows } from '../../shared/climate/hourly-series';
import { equipmentOptionSchema, type EquipmentOptionInput } from '../../shared/equipment/equipment-schemas';
import type { EnergyPrices } from '../../shared/money/energy-prices';
import {
  designLadder,
  indexSweepRecord,
  sweep,
  sweepNaive,
  type SweepDesignValues,
  type SweepOption,
  type SweepRecord,
  type SweepRow,
} from '../../shared/sweep/sweep';

const HOUR_MS = 3_600_000;
const prices: EnergyPrices = {
  currency: 'USD',
  electricityPerKwh: '0.1523',
  gas: { unit: 'therm', price: '1.20' },
  oilPerLitre: '1.05',
  propanePerLitre: '0.90',
};
const money = (cents: number): string => (cents / 100).toFixed(2);
const tenth = (min: number, max: number) => fc.integer({ min: min * 10, max: max * 10 }).map((v) => v / 10);

const buildingArb: fc.Arbitrary<Building> = fc
  .record({
    indoorDesignC: fc.integer({ min: 18, max: 23 }),
    ua: fc.integer({ min: 50, max: 500 }),
    leakage: fc.oneof(
      fc.record({ mode: fc.constant('ach' as const), ach: tenth(0, 2), volumeM3: fc.integer({ min: 200, max: 600 }) }),
      fc.record({
        mode: fc.constant('ela' as const),
        elaCm2: fc.integer({ min: 0, max: 1000 }),
        storeys: fc.constantFrom(1 as const, 2 as const, 3 as const),
        shieldingClass: fc.constantFrom(1 as const, 2 as const, 3 as const, 4 as const, 5 as const),
      }),
    ),
    ductLossPct: fc.integer({ min: 0, max: 30 }),
    internalGainsW: fc.integer({ min: 0, max: 1500 }),
    safetyFactorPct: fc.integer({ min: 0, max: 20 }),
    tau: fc.integer({ min: 5, max: 100 }),
  })
  .map((b): Building => {
    const input: BuildingInput = {
      indoorDesignC: b.indoorDesignC,
      conduction: { mode: 'ua', uaWPerK: b.ua },
      airLeakage: b.leakage,
      ductLossPct: b.ductLossPct,
      internalGainsW: b.internalGainsW,
      safetyFactorPct: b.safetyFactorPct,
      thermalMass: { mode: 'hours', timeConstantH: b.tau },
    };
    return buildingSchema.parse(input);
  });

/** Up to 3 years of up to 60 hours each; some hours missing (NaN) and some without wind. */
const recordArb: fc.Arbitrary<SweepRecord> = fc
  .array(
    fc.array(fc.record({ t: fc.option(tenth(-35, 15), { freq: 8 }), w: fc.option(tenth(0, 15), { freq: 2 }) }), {
      minLength: 1,
      maxLength: 60,
    }),
    { minLength: 1, maxLength: 3 },
  )
  .map((years) => {
    const time: number[] = [];
    const dryBulbC: number[] = [];
    const windSpeedMs: number[] = [];
    years.forEach((hours, y) => {
      hours.forEach((h, k) => {
        time.push(Date.UTC(2001 + y, 0, 1) + k * HOUR_MS);
        dryBulbC.push(h.t ?? NaN);
        windSpeedMs.push(h.w ?? NaN);
      });
    });
    return {
      series: seriesFromRows({ time, dryBulbC, windSpeedMs }),
      qualifyingYears: years.map((_, y) => 2001 + y),
    };
  });

const designArb: fc.Arbitrary<SweepDesignValues> = fc
  .record({ db99: tenth(-20, 5), d1: tenth(0, 5), d2: tenth(0, 8), d3: tenth(0, 6), r: fc.boolean() })
  .map(({ db99, d1, d2, d3, r }) => {
    const db99_6 = db99 - d1;
    const mean = db99_6 - d2;
    return {
      heating: { db99, db99_6 },
      extremeMin: {
        mean,
        returnPeriod: r ? { '5': mean - 0.3 * d3, '10': mean - 0.6 * d3, '20': null, '50': mean - d3 } : undefined,
      },
    };
  });

const flatArb: fc.Arbitrary<EquipmentOptionInput> = fc
  .record({
    kind: fc.constantFrom('furnace' as const, 'boiler' as const, 'electric' as const),
    outputW: fc.integer({ min: 1500, max: 30000 }),
    efficiency: fc.integer({ min: 60, max: 99 }).map((e) => e / 100),
    fuel: fc.constantFrom('gas' as const, 'oil' as const, 'propane' as const),
    cents: fc.integer({ min: 100_000, max: 2_000_000 }),
    lifeYears: fc.integer({ min: 5, max: 30 }),
    cd: fc.option(fc.integer({ min: 0, max: 50 }).map((c) => c / 100)),
    minOutput: fc.option(fc.integer({ min: 10, max: 100 }).map((m) => m / 100)),
  })
  .map((o): EquipmentOptionInput => {
    const cycling = {
      ...(o.cd === null ? {} : { cyclingDegradation: o.cd }),
      ...(o.minOutput === null ? {} : { minOutputFraction: o.minOutput }),
    };
    return o.kind === 'electric'
      ? {
          kind: 'electric',
          label: 'E',
          outputW: o.outputW,
          installedPrice: money(o.cents),
          lifeYears: o.lifeYears,
          ...cycling,
        }
      : {
          kind: o.kind,
          label: 'F',
          fuel: o.fuel,
          efficiency: o.efficiency,
          outputW: o.outputW,
          installedPrice: money(o.cents),
          lifeYears: o.lifeYears,
          ...cycling,
        };
  });

/**
 * Records with runs of missing hours (gaps from 1 to 10 hours, on both sides of the 6-hour limit
 * beyond which the indoor temperature restarts at the set-point) and long cold spells.
 */
const gappyRecordArb: fc.Arbitrary<SweepRecord> = fc
  .array(
    fc.record({
      run: fc.array(tenth(-35, 5), { minLength: 1, maxLength: 30 }),
      gap: fc.integer({ min: 0, max: 10 }),
    }),
    { minLength: 1, maxLength: 8 },
  )
  .map((pieces) => {
    const time: number[] = [];
    const dryBulbC: number[] = [];
    const windSpeedMs: number[] = [];
    let k = 0;
    for (const p of pieces) {
      for (const t of p.run) {
        time.push(Date.UTC(2001, 0, 1) + k++ * HOUR_MS);
        dryBulbC.push(t);
        windSpeedMs.push(NaN);
      }
      k += p.gap;
    }
    return { series: seriesFromRows({ time, dryBulbC, windSpeedMs }), qualifyingYears: [2001] };
  });

const sizingArb = fc.constantFrom('compressor' as const, 'with-backup' as const);

const heatPumpArb: fc.Arbitrary<EquipmentOptionInput> = fc
  .record({
    q47: fc.integer({ min: 3000, max: 20000 }),
    f17: fc.integer({ min: 40, max: 95 }),
    cop47: tenth(2.5, 5),
    cop17: tenth(1.5, 3),
    m15: fc.option(fc.record({ f: fc.integer({ min: 50, max: 95 }), cop: tenth(1.2, 2.5) })),
    backupW: fc.constantFrom(0, 3000, 5000, 10000),
    extrapolate: fc.boolean(),
    defrostBand: fc.boolean(),
    cutoutC: fc.option(fc.integer({ min: -30, max: -10 })),
    cents: fc.integer({ min: 300_000, max: 3_000_000 }),
    cd: fc.option(fc.integer({ min: 0, max: 50 }).map((c) => c / 100)),
    minOutput: fc.option(fc.integer({ min: 10, max: 100 }).map((m) => m / 100)),
  })
  .map((h): EquipmentOptionInput => {
    const q17 = (h.q47 * h.f17) / 100;
    return {
      kind: 'heat-pump',
      label: 'HP',
      installedPrice: money(h.cents),
      lifeYears: 15,
      capacity8_3W: h.q47,
      cop8_3: h.cop47,
      capacityM8_3W: q17,
      copM8_3: h.cop17,
      ...(h.m15 ? { capacityM15W: (q17 * h.m15.f) / 100, copM15: h.m15.cop } : {}),
      backupW: h.backupW,
      extrapolate: h.extrapolate,
      defrostBand: h.defrostBand,
      ...(h.cutoutC === null ? {} : { cutoutC: h.cutoutC }),
      ...(h.cd === null ? {} : { cyclingDegradation: h.cd }),
      ...(h.minOutput === null ? {} : { minOutputFraction: h.minOutput }),
    };
  });

const withIds = (inputs: EquipmentOptionInput[]): SweepOption[] =>
  inputs.map((o, i) => ({ ...equipmentOptionSchema.parse(o), id: `opt-${i}` }));

const close = (a: number, b: number): boolean => Math.abs(a - b) <= 1e-9 * Math.max(1, Math.abs(a), Math.abs(b));

/** Every field equal; numbers to 1e-9 relative; money strings to 1e-9 relative or one cent of rounding. */
function assertRowsAgree(fast: SweepRow[], naive: SweepRow[]): void {
  assert.equal(fast.length, naive.length);
  fast.forEach((f, i) => {
    const n: SweepRow | undefined = naive[i];
    assert.ok(n);
    for (const key of Object.keys(n) as (keyof SweepRow)[]) {
      const a: SweepRow[keyof SweepRow] = f[key];
      const b: SweepRow[keyof SweepRow] = n[key];
      if (typeof a === 'number' && typeof b === 'number') {
        assert.ok(close(a, b), `row ${i} ${key}: fast ${a} vs naive ${b}`);
      } else if ((key === 'annualCost' || key === 'lifeCycleCost') && typeof a === 'string' && typeof b === 'string') {
        assert.ok(
          Math.abs(Number(a) - Number(b)) <= 0.01 + 1e-9 * Math.abs(Number(b)),
          `row ${i} ${key}: ${a} vs ${b}`,
        );
      } else {
        assert.equal(a, b, `row ${i} ${key}`);
      }
    }
  });
}

describe('sweep properties', () => {
  it('fast sweep equals the naive sweep (furnaces, boilers, electric, heat pumps; ACH and ELA)', () => {
    fc.assert(
      fc.property(
        buildingArb,
        fc.array(fc.oneof(flatArb, heatPumpArb), { minLength: 1, maxLength: 5 }),
        recordArb,
        designArb,
        fc.double({ min: 0, max: 12, noNaN: true }),
        fc.integer({ min: 0, max: 8 }),
        sizingArb,
        fc.record({ study: fc.integer({ min: 1, max: 40 }), escalation: fc.integer({ min: -2, max: 5 }) }),
        (building, options, record, designConditions, designWindMs, rate, heatPumpSizing, period) => {
          const input = {
            building,
            options: withIds(options),
            prices,
            economics: {
              discountRatePct: rate,
              studyPeriodYears: period.study,
              energyEscalationPctPerYear: period.escalation,
            },
            designConditions,
            designWindMs,
            record,
            heatPumpSizing,
          };
          const fast = sweep(input);
          const naive = sweepNaive(input);
          assert.deepEqual(fast.years, naive.years);
          assertRowsAgree(fast.rows, naive.rows);
        },
      ),
      { numRuns: 150 },
    );
  });

  it('fast sweep equals the naive sweep on records with gaps (mixed families, variable capacity, both sizing rules)', () => {
    fc.assert(
      fc.property(
        buildingArb,
        fc.array(fc.oneof(flatArb, heatPumpArb), { minLength: 1, maxLength: 5 }),
        gappyRecordArb,
        designArb,
        sizingArb,
        (building, options, record, designConditions, heatPumpSizing) => {
          const input = {
            building,
            options: withIds(options),
            prices,
            economics: { discountRatePct: 3 },
            designConditions,
            designWindMs: 6.7,
            record,
            heatPumpSizing,
          };
          assertRowsAgree(sweep(input).rows, sweepNaive(input).rows);
        },
      ),
      { numRuns: 150 },
    );
  });

  it('fast sweep equals the naive sweep off the 0.1 K grid, and an index reused across sweeps changes nothing', () => {
    // Temperatures as arbitrary doubles: the bins come from a map instead of the 0.1 K array.
    const offGrid: fc.Arbitrary<SweepRecord> = recordArb.map((r) => {
      if (!('series' in r)) return r;
      const dryBulbC = Array.from(r.series.dryBulbC, (t, i) => (Number.isNaN(t) ? t : t + ((i * 0.37) % 0.09) + 0.001));
      return { ...r, series: { ...r.series, dryBulbC: Float64Array.from(dryBulbC) } };
    });
    fc.assert(
      fc.property(
        buildingArb,
        fc.array(fc.oneof(flatArb, heatPumpArb), { minLength: 1, maxLength: 5 }),
        offGrid,
        designArb,
        (building, options, record, designConditions) => {
          const input = {
            building,
            options: withIds(options),
            prices,
            economics: { discountRatePct: 3 },
            designConditions,
            designWindMs: 4,
            record,
          };
          const naive = sweepNaive(input);
          assertRowsAgree(sweep(input).rows, naive.rows);
          const index = indexSweepRecord(record);
          sweep({ ...input, record: index });
          assertRowsAgree(sweep({ ...input, record: index }).rows, naive.rows);
        },
      ),
      { numRuns: 100 },
    );
  });

  it('a colder design temperature never selects a smaller unit, never raises unmet hours, never lowers the price', () => {
    fc.assert(
      fc.property(
        buildingArb,
        fc.array(fc.integer({ min: 1500, max: 30000 }), { minLength: 1, maxLength: 6 }),
        fc.integer({ min: 0, max: 3 }),
        recordArb,
        designArb,
        (building, outputs, fuelIndex, record, designConditions) => {
          // Prices rise with output (equal outputs, equal prices): 1000 $ + 0.5 $/W.
          const options = withIds(
            outputs.map((outputW) => ({
              kind: 'furnace' as const,
              label: 'F',
              fuel: (['gas', 'oil', 'propane', 'gas'] as const)[fuelIndex] ?? 'gas',
              efficiency: 0.9,
              outputW,
              installedPrice: money(100_000 + 50 * outputW),
              lifeYears: 20,
            })),
          );
          const rows = sweep({
            building,
            options,
            prices,
            economics: { discountRatePct: 3 },
            designConditions,
            designWindMs: 6.7,
            record,
          }).rows;
          for (let i = 1; i < rows.length; i++) {
            const milder = rows[i - 1];
            const colder = rows[i];
            assert.ok(milder && colder);
            assert.ok(colder.designC <= milder.designC);
            if (milder.selectedOptionId === null) {
              assert.equal(colder.selectedOptionId, null, 'a colder row found a unit the milder one did not');
              continue;
            }
            if (colder.selectedOptionId === null) continue;
            assert.ok((colder.capacityAtDesignW ?? 0) >= (milder.capacityAtDesignW ?? 0), 'smaller unit');
            assert.ok(Number(colder.installedPrice) >= Number(milder.installedPrice), 'lower price');
            assert.ok((colder.unmetHoursPerYear ?? 0) <= (milder.unmetHoursPerYear ?? 0), 'more unmet hours');
            assert.ok(
              (colder.unmetHoursWorstYear ?? 0) <= (milder.unmetHoursWorstYear ?? 0),
              'more unmet hours, worst year',
            );
          }
        },
      ),
      { numRuns: 150 },
    );
  });

  it('no unmet hours, degree-hours or sag when the capacity exceeds the load of the coldest hour', () => {
    fc.assert(
      fc.property(buildingArb, recordArb, designArb, fc.boolean(), (building, record, designConditions, asHeatPump) => {
        assert.ok('series' in record);
        let coldest = Infinity;
        for (const t of record.series.dryBulbC) if (!Number.isNaN(t) && t < coldest) coldest = t;
        const ladderColdest = Math.min(...designLadder(designConditions).map((r) => r.designC));
        // Load grows with ΔT and (ELA mode) with wind: bound it at the colder of the two and 20 m/s.
        const bound = heatLoss(building, Math.min(coldest, ladderColdest), 20).designLoadW + 1;
        const unit: EquipmentOptionInput = asHeatPump
          ? {
              kind: 'heat-pump',
              label: 'HP',
              installedPrice: '9000.00',
              lifeYears: 15,
              capacity8_3W: 8000,
              cop8_3: 3.5,
              capacityM8_3W: 5000,
              copM8_3: 2.2,
              cutoutC: -20,
              backupW: Math.ceil(bound),
            }
          : {
              kind: 'boiler',
              label: 'B',
              fuel: 'oil',
              efficiency: 0.85,
              outputW: Math.ceil(bound),
              installedPrice: '7000.00',
              lifeYears: 25,
            };
        const rows = sweep({
          building,
          options: withIds([unit]),
          prices,
          economics: { discountRatePct: 3 },
          designConditions,
          designWindMs: 6.7,
          record,
          // The backup carries the load here: the compressor alone need not cover it.
          heatPumpSizing: 'with-backup',
        }).rows;
        for (const r of rows) {
          assert.equal(r.selectedOptionId, 'opt-0');
          assert.equal(r.unmetHoursPerYear, 0);
          assert.equal(r.unmetHoursWorstYear, 0);
          assert.equal(r.unmetDegreeHoursPerYear, 0);
          assert.equal(r.worstDropK, 0);
          assert.equal(r.lowestIndoorC, building.indoorDesignC);
        }
      }),
      { numRuns: 100 },
    );
  });
});
