/**
 * Equipment capacity against docs/methods.md#equipment (test vectors #15 and #16 of §10). Tags: [S] confirmed in a
 * source, [M] from memory, [C] computed from the formula shown.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { buildingSchema, type Building } from '../../shared/building/building-schemas';
import { heatLoss } from '../../shared/building/heat-loss';
import { fromSi, toSi } from '../../shared/units/units';
import {
  balancePoint,
  capacityAt,
  defaultH2Point,
  heatPumpAt,
  RATING_C,
  ratedOutputW,
} from '../../shared/equipment/capacity';
import {
  equipmentOptionSchema,
  type EquipmentOption,
  type EquipmentOptionInput,
  type HeatPumpOption,
} from '../../shared/equipment/equipment-schemas';
import { assertClose } from './close-to';

const heatPump = (extra: Partial<EquipmentOptionInput> = {}): HeatPumpOption => {
  const o = equipmentOptionSchema.parse({
    kind: 'heat-pump',
    label: '3-ton split',
    // docs/methods.md#heat-pump-capacity check unit: Q47 = 10 kW, COP47 = 3.5; Q17 = 6 kW, COP17 = 2.3.
    capacity8_3W: 10_000,
    cop8_3: 3.5,
    capacityM8_3W: 6_000,
    copM8_3: 2.3,
    installedPrice: '9800.00',
    lifeYears: 15,
    ...extra,
  });
  assert.equal(o.kind, 'heat-pump');
  return o;
};

describe('rating temperatures (AHRI 210/240, DOE App. M; docs/methods.md#heat-pump-capacity)', () => {
  it('are 47, 35, 17 and 5 °F in °C', () => {
    assertClose(RATING_C.h1, 8.333, 1e-3, 'H1'); // [S] 8.33 °C via AHRI 1230 conditions (docs/methods.md#heat-pump-capacity)
    assertClose(RATING_C.h3, -8.333, 1e-3, 'H3'); // [S]
    assertClose(RATING_C.h2, 1.667, 1e-3, 'H2'); // [M]
    assert.equal(RATING_C.h4, -15); // [S] 5 °F, ENERGY STAR cold-climate criteria
  });
});

describe('heat-pump capacity (#15, docs/methods.md#heat-pump-capacity)', () => {
  it('interpolates capacity and input linearly: 0 °C → 8.000 kW, COP 2.9273', () => {
    const c = heatPumpAt(heatPump(), 0);
    assertClose(c.capacityW, 8000, 1e-6, 'Q(0 °C)'); // [C] docs/methods.md#check-values
    assertClose(c.powerW, 2732.919, 1e-3, 'P(0 °C)'); // [C] docs/methods.md#heat-pump-capacity
    assertClose(c.cop, 2.9273, 1e-4, 'COP(0 °C)'); // [C]
  });

  it('with the frost/defrost band, 0 °C → 7.300 kW, COP 2.7053; default H2 point 7.560 kW', () => {
    const hp = heatPump({ defrostBand: true });
    const h2 = defaultH2Point(hp);
    assertClose(h2.capacityW, 7560, 1e-6, 'Q35'); // [C] docs/methods.md#check-values (DOE default 0.90 factor [M])
    assertClose(h2.powerW, 2716.398, 1e-3, 'P35'); // [C]
    assertClose(h2.capacityW / h2.powerW, 2.7831, 1e-4, 'COP35'); // [C]
    const c = heatPumpAt(hp, 0);
    assertClose(c.capacityW, 7300, 1e-6, 'Q(0 °C) frost'); // [C] docs/methods.md#check-values
    assertClose(c.powerW, 2698.447, 1e-3, 'P(0 °C) frost');
    assertClose(c.cop, 2.7053, 1e-4, 'COP(0 °C) frost');
    // Outside the band (≥ 45 °F = 7.2 °C) the 47/17 line applies again: 8 °C → by hand 8000 + 240 × 8.
    assertClose(heatPumpAt(hp, 8).capacityW, 8000 + 240 * 8, 1e-6, 'Q(8 °C)');
  });

  it('holds capacity and COP flat below the coldest rating point unless extrapolation is chosen', () => {
    const flat = heatPumpAt(heatPump(), -15);
    assertClose(flat.capacityW, 6000, 1e-9, 'flat Q(−15 °C)');
    assertClose(flat.cop, 2.3, 1e-9, 'flat COP(−15 °C)');
    const ext = heatPumpAt(heatPump({ extrapolate: true }), -15);
    assertClose(ext.capacityW, 4400, 1e-6, 'extrapolated Q(5 °F)'); // [C] docs/methods.md#heat-pump-capacity
    assertClose(ext.powerW, 2509.317, 1e-3, 'extrapolated P(5 °F)');
    assertClose(ext.cop, 1.7535, 1e-4, 'extrapolated COP(5 °F)');
    // Far below, the extrapolated capacity floors at zero instead of going negative.
    assert.equal(heatPumpAt(heatPump({ extrapolate: true }), -60).capacityW, 0);
  });

  it('uses a third rating point at −15 °C, flat or extrapolated beyond it', () => {
    const three = { capacityM15W: 4800, copM15: 1.9 };
    // [C] by hand: between (−8.333, 6000) and (−15, 4800) the slope is 1200/6.6667 = 180 W/K.
    assertClose(heatPumpAt(heatPump(three), -12).capacityW, 6000 - 180 * (-8.3333333333 + 12), 1e-4, 'Q(−12 °C)');
    assertClose(heatPumpAt(heatPump(three), -20).capacityW, 4800, 1e-9, 'flat Q(−20 °C)');
    assertClose(heatPumpAt(heatPump(three), -20).cop, 1.9, 1e-9, 'flat COP(−20 °C)');
    assertClose(
      heatPumpAt(heatPump({ ...three, extrapolate: true }), -20).capacityW,
      4800 - 180 * 5,
      1e-6,
      'extrapolated Q(−20 °C)',
    );
    // Above −8.3 °C the third point plays no part.
    assertClose(heatPumpAt(heatPump(three), 0).capacityW, 8000, 1e-6, 'Q(0 °C)');
  });

  it('adds the electric backup at COP 1 and honours a low-ambient cut-out', () => {
    const hp = heatPump({ backupW: 5000, cutoutC: -20 });
    const c = capacityAt(hp, 0);
    assertClose(c.compressorW, 8000, 1e-6, 'compressor');
    assert.equal(c.backupW, 5000);
    assertClose(c.totalW, 13_000, 1e-6, 'total');
    assertClose(c.inputW, 2732.919 + 5000, 1e-3, 'input');
    const cold = capacityAt(hp, -25);
    assert.equal(cold.compressorW, 0);
    assert.equal(cold.totalW, 5000);
    assert.equal(cold.cop, 0);
  });
});

describe('combustion and electric output (docs/methods.md#combustion-output)', () => {
  it('80 000 Btu/h input × 0.95 = 76 000 Btu/h = 22.27 kW', () => {
    const furnace = equipmentOptionSchema.parse({
      kind: 'furnace',
      label: '80k condensing',
      fuel: 'gas',
      inputW: toSi('power', 80_000, 'IP'),
      efficiency: 0.95,
      installedPrice: '5200',
      lifeYears: 20,
    });
    const c = capacityAt(furnace, -30);
    assertClose(fromSi('power', c.totalW, 'IP'), 76_000, 1e-6, 'Btu/h'); // [C] docs/methods.md#combustion-output
    assertClose(c.totalW / 1000, 22.27, 0.005, 'kW');
    assert.equal(c.cop, 0.95);
    assertClose(c.inputW, toSi('power', 80_000, 'IP'), 1e-6, 'input');
  });

  it('electric resistance delivers its output at efficiency 1', () => {
    const heater = equipmentOptionSchema.parse({
      kind: 'electric',
      label: 'Baseboard',
      outputW: 9000,
      installedPrice: '1500',
      lifeYears: 25,
    });
    assert.equal(heater.kind === 'electric' && ratedOutputW(heater), 9000);
    assert.deepEqual(capacityAt(heater, -40), { compressorW: 0, backupW: 0, totalW: 9000, cop: 1, inputW: 9000 });
  });
});

describe('balance point (#16, docs/methods.md#balance-point)', () => {
  const building = (ua: number, extra: Record<string, unknown> = {}): Building =>
    buildingSchema.parse({
      indoorDesignC: 21,
      conduction: { mode: 'ua', uaWPerK: ua },
      airLeakage: { mode: 'ach', ach: 0, volumeM3: 300 },
      thermalMass: { mode: 'hours', timeConstantH: 30 },
      ...extra,
    });

  it('9.0 kW at −15 °C (UA 0.25 kW/K) with Q = 8.0 + 0.24·T kW → −5.612 °C, at 6.653 kW', () => {
    // [C] docs/methods.md#balance-point: T_bp = (UA·t_in − a)/(UA + b) = (250·21 − 8000)/(250 + 240).
    const b = building(250);
    assertClose(heatLoss(b, -15, 0).totalW, 9000, 1e-9, 'design load');
    const t = balancePoint(heatPump(), b, 6.7);
    assertClose(t, -5.612, 1e-3, 'T_bp');
    assertClose(t, (250 * 21 - 8000) / (250 + 240), 1e-6, 'T_bp by formula');
    assertClose(heatPumpAt(heatPump(), t ?? 0).capacityW, 6653, 1, 'capacity at T_bp'); // [C] 6.653 kW
    // At −15 °C the deficit is 9.0 − 4.4 = 4.6 kW with extrapolation (docs/methods.md#balance-point [C]).
    assertClose(
      heatLoss(b, -15, 0).totalW - heatPumpAt(heatPump({ extrapolate: true }), -15).capacityW,
      4600,
      1e-6,
      'deficit',
    );
  });

  it('credits internal gains: L = UA·(t_in − T) − G', () => {
    // [C] (250·21 − 500 − 8000)/(250 + 240) = −6.633 °C.
    assertClose(
      balancePoint(heatPump(), building(250, { internalGainsW: 500 }), 0),
      (250 * 21 - 500 - 8000) / 490,
      1e-6,
      'T_bp',
    );
  });

  it('is where capacity meets the load with wind-driven ELA infiltration too', () => {
    const b = building(180, { airLeakage: { mode: 'ela', elaCm2: 500, storeys: 2, shieldingClass: 3 } });
    const calm = balancePoint(heatPump(), b, 0);
    const windy = balancePoint(heatPump(), b, 10);
    assert.ok(calm !== null && windy !== null);
    assertClose(heatPumpAt(heatPump(), windy).capacityW, heatLoss(b, windy, 10).loadW, 1e-3, 'balance');
    assert.ok(windy > calm, 'wind raises the balance point');
  });

  it('of a furnace is where its output meets the load: 10 kW at UA 250 W/K → −19 °C', () => {
    const furnace: EquipmentOption = equipmentOptionSchema.parse({
      kind: 'boiler',
      label: 'Boiler',
      fuel: 'oil',
      outputW: 10_000,
      efficiency: 0.86,
      installedPrice: '7000.00',
      lifeYears: 25,
    });
    assertClose(balancePoint(furnace, building(250), 0), 21 - 10_000 / 250, 1e-6, 'T'); // [C]
  });

  it('is null when the capacity stays above the load over the whole range', () => {
    assert.equal(balancePoint(heatPump(), building(50), 0), null); // 50 × 71 = 3550 W < 6000 W flat at −50 °C
    assert.equal(balancePoint(heatPump(), building(250), 0, { minC: 0 }), null);
  });
});

describe('equipment schema', () => {
  const base = { label: 'Unit', installedPrice: '4500.00', lifeYears: 18 };
  const issues = (input: unknown) => {
    const r = equipmentOptionSchema.safeParse(input);
    assert.ok(!r.success, 'expected a refusal');
    return r.error.issues;
  };

  it('wants the output or the input of a furnace, not both and not neither', () => {
    const both = issues({ ...base, kind: 'furnace', fuel: 'gas', efficiency: 0.95, outputW: 20_000, inputW: 21_000 });
    assert.match(both[0]?.message ?? '', /not both/);
    const neither = issues({ ...base, kind: 'furnace', fuel: 'gas', efficiency: 0.95 });
    assert.deepEqual(neither[0]?.path, ['outputW']);
  });

  it('refuses wrong fuels, efficiencies, partial −15 °C ratings and bad prices', () => {
    assert.match(
      issues({ ...base, kind: 'furnace', fuel: 'electricity', efficiency: 0.95, outputW: 1 })[0]?.message ?? '',
      /gas, oil or propane/,
    );
    assert.match(
      issues({ ...base, kind: 'boiler', fuel: 'gas', efficiency: 95, outputW: 1 })[0]?.message ?? '',
      /0\.95/,
    );
    assert.ok(issues({ ...base, kind: 'electric', outputW: 1, efficiency: 0.9 }).length > 0);
    const hp = { ...base, kind: 'heat-pump', capacity8_3W: 10_000, cop8_3: 3.5, capacityM8_3W: 6000, copM8_3: 2.3 };
    assert.deepEqual(issues({ ...hp, capacityM15W: 4000 })[0]?.path, ['copM15']);
    assert.match(issues({ ...hp, installedPrice: '9,800' })[0]?.message ?? '', /1234\.50/);
    assert.match(issues({ ...hp, kind: 'stove' })[0]?.message ?? '', /furnace, boiler, heat-pump or electric/);
  });
});
