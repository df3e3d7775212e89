/**
 * Properties of the uncertainty band (docs/methods.md#uncertainty-band), with fast-check on random
 * buildings, records and equipment: with zero tolerances every percentile is the nominal sweep's
 * figure; the same seed gives the same band; a wider tolerance never narrows the band. Each is a
 * consequence of the method's definition (uniform factors, type-7 percentiles), stated beside it.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import { buildingSchema, type Building } from '../../shared/building/building-schemas';
import { seriesFromRows } from '../../shared/climate/hourly-series';
import { equipmentOptionSchema } from '../../shared/equipment/equipment-schemas';
import type { EnergyPrices } from '../../shared/money/energy-prices';
import {
  monteCarloSweep,
  scaleBuilding,
  scalePrices,
  seededUniform,
  type Tolerances,
} from '../../shared/sweep/monte-carlo';
import { indexSweepRecord, sweep, type SweepInput, type SweepOption } from '../../shared/sweep/sweep';
import { conductionUa } from '../../shared/building/heat-loss';

const HOUR_MS = 3_600_000;
const PRICES: EnergyPrices = { currency: 'USD', electricityPerKwh: '0.16', gas: { unit: 'kWh', price: '0.045' } };
const ZERO: Tolerances = { uaPct: 0, airLeakagePct: 0, pricesPct: 0 };

/** A house, two or three furnaces and a heat pump, and two to three short invented years of hours. */
const caseArb: fc.Arbitrary<SweepInput> = fc
  .record({
    ua: fc.integer({ min: 80, max: 400 }),
    ach: fc.integer({ min: 0, max: 15 }).map((x) => x / 10),
    envelope: fc.boolean(),
    sizes: fc.uniqueArray(fc.integer({ min: 3, max: 25 }), { minLength: 2, maxLength: 3 }),
    q47: fc.integer({ min: 4000, max: 15000 }),
    years: fc.array(
      fc.array(
        fc.integer({ min: -300, max: 120 }).map((t) => t / 10),
        { minLength: 24, maxLength: 150 },
      ),
      {
        minLength: 2,
        maxLength: 3,
      },
    ),
  })
  .map(({ ua, ach, envelope, sizes, q47, years }): SweepInput => {
    const building: Building = buildingSchema.parse({
      indoorDesignC: 21,
      conduction: envelope
        ? {
            mode: 'envelope',
            components: [
              { label: 'Walls', areaM2: ua, uValue: 0.6 },
              { label: 'Roof', areaM2: 100, rValue: 2.5 },
            ],
          }
        : { mode: 'ua', uaWPerK: ua },
      airLeakage: { mode: 'ach', ach, volumeM3: 400 },
      thermalMass: { mode: 'hours', timeConstantH: 30 },
    });
    const options: SweepOption[] = [
      ...sizes.map((kw, i) => ({
        ...equipmentOptionSchema.parse({
          kind: 'furnace',
          label: `F${kw}`,
          fuel: 'gas',
          efficiency: 0.95,
          outputW: kw * 1000,
          installedPrice: (3000 + kw * 100).toFixed(2),
          lifeYears: 20,
        }),
        id: `f${i}`,
      })),
      {
        ...equipmentOptionSchema.parse({
          kind: 'heat-pump',
          label: 'HP',
          capacity8_3W: q47,
          cop8_3: 3.5,
          capacityM8_3W: q47 * 0.65,
          copM8_3: 2.2,
          backupW: 3000,
          installedPrice: '9000.00',
          lifeYears: 15,
        }),
        id: 'hp',
      },
    ];
    const time: number[] = [];
    const dryBulbC: number[] = [];
    years.forEach((hours, y) =>
      hours.forEach((t, k) => {
        time.push(Date.UTC(2001 + y, 0, 1) + k * HOUR_MS);
        dryBulbC.push(t);
      }),
    );
    const minimum = Math.min(...dryBulbC);
    return {
      building,
      options,
      prices: PRICES,
      economics: { discountRatePct: 3 },
      designConditions: {
        heating: { db99: minimum + 6, db99_6: minimum + 4 },
        extremeMin: { mean: minimum + 2, returnPeriod: { '5': minimum + 1, '50': minimum - 3 } },
      },
      designWindMs: 6.7,
      record: indexSweepRecord({
        series: seriesFromRows({ time, dryBulbC }),
        qualifyingYears: years.map((_, y) => 2001 + y),
      }),
    };
  });

describe('Monte Carlo over the tolerances', () => {
  it('with zero tolerances gives the nominal sweep as both P10 and P90, and never a change of unit', () => {
    fc.assert(
      fc.property(caseArb, fc.integer({ min: 0, max: 2 ** 32 - 1 }), (input, seed) => {
        const nominal = sweep(input);
        const band = monteCarloSweep(input, { tolerances: ZERO, draws: 20, seed });
        nominal.rows.forEach((row, i) => {
          const b = band.rows[i];
          assert.ok(b);
          assert.equal(b.unmetHoursPerYearP10, row.unmetHoursPerYear);
          assert.equal(b.unmetHoursPerYearP90, row.unmetHoursPerYear);
          assert.equal(b.unmetHoursWorstYearP10, row.unmetHoursWorstYear);
          assert.equal(b.unmetHoursWorstYearP90, row.unmetHoursWorstYear);
          assert.equal(b.lifeCycleCostP10, row.lifeCycleCost);
          assert.equal(b.lifeCycleCostP90, row.lifeCycleCost);
          assert.equal(b.selectionChangeShare, 0);
        });
      }),
      { numRuns: 25 },
    );
  });

  it('is reproducible: the same seed gives the same band', () => {
    fc.assert(
      fc.property(caseArb, fc.integer({ min: 0, max: 2 ** 32 - 1 }), (input, seed) => {
        const tolerances: Tolerances = { uaPct: 10, airLeakagePct: 25, pricesPct: 15 };
        assert.deepEqual(
          monteCarloSweep(input, { tolerances, draws: 25, seed }),
          monteCarloSweep(input, { tolerances, draws: 25, seed }),
        );
      }),
      { numRuns: 15 },
    );
  });

  it('widens as the tolerances grow (same seed): the unmet-hours band where the unit never changes, the cost band always', () => {
    // With the same seed each draw's factor 1 + t·z moves away from 1 as t grows; unmet hours rise with
    // UA and leakage for a fixed unit, and the life-cycle cost with the price level, so the P10 of the
    // draws (z < 0 there) falls and the P90 rises.
    fc.assert(
      fc.property(
        caseArb,
        fc.integer({ min: 0, max: 2 ** 32 - 1 }),
        fc.integer({ min: 1, max: 20 }),
        fc.integer({ min: 1, max: 20 }),
        (input, seed, small, extra) => {
          const narrow = monteCarloSweep(input, {
            tolerances: { uaPct: small, airLeakagePct: small, pricesPct: 0 },
            draws: 60,
            seed,
          });
          const wide = monteCarloSweep(input, {
            tolerances: { uaPct: small + extra, airLeakagePct: small + extra, pricesPct: 0 },
            draws: 60,
            seed,
          });
          narrow.rows.forEach((n, i) => {
            const w = wide.rows[i];
            assert.ok(w);
            if (n.selectionChangeShare !== 0 || w.selectionChangeShare !== 0 || n.unmetHoursPerYearP10 === null) return;
            assert.ok(
              (w.unmetHoursPerYearP10 ?? NaN) <= n.unmetHoursPerYearP10 + 1e-9,
              `row ${i}: P10 ${w.unmetHoursPerYearP10} > ${n.unmetHoursPerYearP10}`,
            );
            assert.ok(
              (w.unmetHoursPerYearP90 ?? NaN) >= (n.unmetHoursPerYearP90 ?? NaN) - 1e-9,
              `row ${i}: P90 narrowed`,
            );
          });
          const cheap = monteCarloSweep(input, { tolerances: { ...ZERO, pricesPct: small }, draws: 60, seed });
          const dear = monteCarloSweep(input, { tolerances: { ...ZERO, pricesPct: small + extra }, draws: 60, seed });
          cheap.rows.forEach((c, i) => {
            const d = dear.rows[i];
            if (c.lifeCycleCostP10 === null || !d) return;
            const width = (b: typeof c) => Number(b.lifeCycleCostP90) - Number(b.lifeCycleCostP10);
            assert.ok(width(d) >= width(c) - 0.011, `row ${i}: cost band ${width(d)} < ${width(c)}`);
          });
        },
      ),
      { numRuns: 15 },
    );
  });

  it('counts how often the unit changes: a house at the edge of a unit’s capacity changes unit in some draws', () => {
    const sampled = fc.sample(caseArb, { numRuns: 1, seed: 7 })[0];
    assert.ok(sampled);
    // Furnaces every kilowatt from 2 to 60 kW: a design load that moves by half moves across sizes.
    const ladder = Array.from({ length: 59 }, (_, k) => ({
      ...equipmentOptionSchema.parse({
        kind: 'furnace',
        label: `F${k + 2}`,
        fuel: 'gas',
        efficiency: 0.95,
        outputW: (k + 2) * 1000,
        installedPrice: '4000.00',
        lifeYears: 20,
      }),
      id: `f${k + 2}`,
    }));
    const input: SweepInput = { ...sampled, options: ladder };
    const wide = monteCarloSweep(input, {
      tolerances: { uaPct: 50, airLeakagePct: 50, pricesPct: 0 },
      draws: 200,
      seed: 3,
    });
    assert.ok(
      wide.rows.some((r) => r.selectionChangeShare > 0 && r.selectionChangeShare < 1),
      'a ±50 % UA should change the selected unit at some design temperature in some draws',
    );
  });
});

describe('the inputs a draw scales', () => {
  it('scales UA (a U-value up, an R-value down) and the air leakage by the factors', () => {
    const b = buildingSchema.parse({
      conduction: {
        mode: 'envelope',
        components: [
          { label: 'Walls', areaM2: 100, uValue: 0.5 },
          { label: 'Roof', areaM2: 80, rValue: 4 },
        ],
      },
      airLeakage: { mode: 'ach50', ach50: 4, volumeM3: 400, nFactor: 20 },
      thermalMass: { mode: 'hours', timeConstantH: 30 },
    });
    // UA by hand: 100 × 0.5 + 80 / 4 = 70 W/K; × 1.1 = 77 W/K.
    const scaled = scaleBuilding(b, 1.1, 0.8);
    assert.ok(Math.abs(conductionUa(scaled.conduction) - 77) < 1e-9);
    assert.equal(scaled.airLeakage.mode === 'ach50' && scaled.airLeakage.ach50, 3.2);
    assert.equal(scaleBuilding(b, 1, 1).conduction, b.conduction);
    assert.equal(scaleBuilding(b, 1, 1).airLeakage, b.airLeakage);
  });

  it('scales every energy price by the one factor, to six decimals', () => {
    const p = scalePrices({ ...PRICES, oilPerLitre: '1.10' }, 1.15);
    assert.equal(p.electricityPerKwh, '0.184');
    assert.equal(p.gas?.price, '0.05175');
    assert.equal(p.oilPerLitre, '1.265');
    assert.equal(scalePrices(PRICES, 1), PRICES);
  });

  it('draws reproducible uniform numbers in [0, 1) from a seed', () => {
    const a = seededUniform(42);
    const b = seededUniform(42);
    const xs = Array.from({ length: 1000 }, () => a());
    assert.deepEqual(
      xs,
      Array.from({ length: 1000 }, () => b()),
    );
    assert.ok(xs.every((x) => x >= 0 && x < 1));
    const mean = xs.reduce((s, x) => s + x, 0) / xs.length;
    // The mean of 1000 uniform numbers has a standard deviation of 0.0091: 0.5 ± 0.04 is over 4 of them.
    assert.ok(Math.abs(mean - 0.5) < 0.04, `mean ${mean}`);
  });
});
