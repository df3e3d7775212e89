/**
 * Building heat loss against the formulas and check values of docs/methods.md#heat-loss, #indoor-temperature (test
 * vectors #10, #12, #13, #14 of docs/methods.md#check-values). Sources are named beside each check with their tags:
 * [S] confirmed in a source, [M] from memory, [C] computed from the formula shown.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import fc from 'fast-check';
import {
  BUILDING_DEFAULTS,
  buildingSchema,
  DEFAULT_DESIGN_WIND_MS,
  type AirLeakage,
  type Building,
  type BuildingInput,
} from '../../shared/building/building-schemas';
import {
  ach50ToNatural,
  achToLps,
  elaFromAch50,
  envelopeUa,
  heatLoss,
  lblInfiltrationLps,
  N_FACTOR_TABLE,
  nFactorFor,
  resolveDesignWind,
  STACK_COEFFICIENT_SI,
  THERMAL_CAPACITANCE_J_PER_M2K,
  timeConstantHours,
  WIND_COEFFICIENT_SI,
} from '../../shared/building/heat-loss';
import { fromSi, toSi } from '../../shared/units/units';
import { toSi as toSiClimate } from '../../shared/units/units';
import { assertClose } from './close-to';

const building = (input: Partial<BuildingInput> & Pick<BuildingInput, 'conduction' | 'airLeakage'>): Building =>
  buildingSchema.parse({ thermalMass: { mode: 'hours', timeConstantH: 30 }, ...input });

const noLeakage: AirLeakage = { mode: 'ach', ach: 0, volumeM3: 400 };

describe('conduction (docs/methods.md#conduction, ASHRAE Handbook—Fundamentals Ch. 17/18)', () => {
  it('R 3.00 + films 0.12 + 0.03 over 100 m² at ΔT 36 K loses 1142.86 W', () => {
    // [C] docs/methods.md#conduction: U = 1/3.15 = 0.317460 W/(m²·K); q = 0.317460 × 100 × 36 = 1142.86 W.
    // Films: R_si 0.12, R_se 0.03 (ASHRAE Fundamentals Ch. 26 Table 1 via docs/methods.md#surface-films [S IP / C SI]).
    const b = building({
      conduction: { mode: 'envelope', components: [{ label: 'Wall', areaM2: 100, rValue: 3.0 + 0.12 + 0.03 }] },
      airLeakage: noLeakage,
    });
    const r = heatLoss(b, -15, 0);
    assertClose(r.conductanceWPerK.conduction, 31.746, 1e-3, 'UA');
    assertClose(r.conductionW, 1142.86, 0.01, 'conduction W');
    assert.equal(r.deltaTK, 36);
  });

  it('IP check: nominal R-19 + films 0.68 + 0.17 over 1000 ft² at 70 °F → 3526.4 Btu/h', () => {
    // [C] docs/methods.md#conduction (IP films: WAC 51-11-0526 [S]). Entered in IP, converted to SI, and back.
    const rSi = toSi('rValue', 19 + 0.68 + 0.17, 'IP');
    const ua = envelopeUa([{ areaM2: toSi('area', 1000, 'IP'), rValue: rSi }]);
    const w = ua * toSiClimate('temperatureDifference', 70, 'IP');
    assertClose(fromSi('power', w, 'IP'), 3526.4, 0.1, 'Btu/h');
  });

  it('sums A·U over elements given by U or by R', () => {
    // [C] 20 × 0.25 + 10 × 1/0.5 = 5 + 20 = 25 W/K.
    assert.equal(
      envelopeUa([
        { areaM2: 20, uValue: 0.25 },
        { areaM2: 10, rValue: 0.5 },
      ]),
      25,
    );
  });
});

describe('air changes and sensible heat (docs/methods.md#air-heat, #air-changes)', () => {
  it('#10: 0.5 ACH in 400 m³ is 55.556 L/s; × 36 K × 1.23 → 2460.0 W', () => {
    assertClose(achToLps(0.5, 400), 55.556, 1e-3, 'L/s'); // [C] docs/methods.md#air-changes
    const b = building({
      conduction: { mode: 'ua', uaWPerK: 1 },
      airLeakage: { mode: 'ach', ach: 0.5, volumeM3: 400 },
    });
    const r = heatLoss(b, -15, 3);
    assertClose(r.infiltrationLps, 55.556, 1e-3, 'infiltration L/s');
    assertClose(r.infiltrationW, 2460.0, 0.1, 'infiltration W'); // [C] docs/methods.md#check-values
  });

  it('0.5 ACH in 15 000 ft³ is 125 cfm (docs/methods.md#air-changes [C])', () => {
    const lps = achToLps(0.5, toSi('volume', 15_000, 'IP'));
    assertClose(fromSi('airflow', lps, 'IP'), 125, 1e-9, 'cfm');
  });
});

describe('blower door ACH50 → natural ACH (docs/methods.md#ach50, LBL N-factor)', () => {
  it('#14: zone 2, normal shielding, 1 storey → N = 18.5 [M: docs/methods.md#ach50 table, from memory]', () => {
    assert.equal(nFactorFor(2, 1, 'normal'), 18.5);
    // [C] docs/methods.md#ach50: 2.75 ACH50 / 18.5 = 0.1486 ACH; 5 ACH50 / 20 = 0.25 ACH.
    assertClose(ach50ToNatural(2.75, nFactorFor(2, 1, 'normal')), 0.1486, 1e-4, 'ACH');
    assert.equal(ach50ToNatural(5, 20), 0.25);
    assert.throws(() => ach50ToNatural(5, 0), RangeError);
  });

  it('the table follows docs/methods.md#ach50: N_zone × storey factor × shielding factor, to ±0.1 [M]', () => {
    const zoneBase = { 1: 15.5, 2: 18.5, 3: 21.5, 4: 24.5 } as const;
    const storeyFactor = [1.0, 0.9, 0.8, 0.7];
    const shieldFactor = { 'well-shielded': 1.2, normal: 1.0, exposed: 0.9 } as const;
    for (const zone of [1, 2, 3, 4] as const) {
      for (const shielding of ['well-shielded', 'normal', 'exposed'] as const) {
        const row = N_FACTOR_TABLE[zone][shielding];
        storeyFactor.forEach((f, i) => {
          assertClose(row[i], zoneBase[zone] * f * shieldFactor[shielding], 0.1, `zone ${zone} ${shielding} [${i}]`);
        });
      }
    }
    // Spot values transcribed from docs/methods.md#ach50 [M/C].
    assert.equal(nFactorFor(1, 3, 'exposed'), 9.8);
    assert.equal(nFactorFor(4, 1.5, 'well-shielded'), 26.5);
    assert.equal(nFactorFor(3, 2, 'normal'), 17.2);
  });

  it('an ACH50 building infiltrates ACH50/N air changes', () => {
    const b = building({
      conduction: { mode: 'ua', uaWPerK: 100 },
      airLeakage: { mode: 'ach50', ach50: 5, volumeM3: 360, nFactor: 20 },
    });
    // [C] 5/20 = 0.25 ACH × 360 m³ / 3.6 = 25 L/s; × 1.23 × 30 K = 922.5 W.
    assertClose(heatLoss(b, -9, 10).infiltrationW, 922.5, 1e-9, 'W');
  });
});

describe('effective leakage area (docs/methods.md#ela, ASHRAE Handbook—Fundamentals Ch. 16)', () => {
  it('#12: 400 m³ at 5 ACH50, n = 0.65, ρ = 1.2 → 416.66 cm²', () => {
    assertClose(elaFromAch50(5, 400), 416.66, 0.01, 'cm²'); // [C] docs/methods.md#ela
    // [C] by hand: Q50 = 5 × 400 / 3600 m³/s; Q4 = Q50·(4/50)^0.65; A = 10⁴·Q4·√(1.2/8).
    const byHand = 10_000 * ((5 * 400) / 3600) * (4 / 50) ** 0.7 * Math.sqrt(1.2 / 8);
    assertClose(elaFromAch50(5, 400, { exponent: 0.7 }), byHand, 1e-9, 'cm² with n = 0.7');
  });
});

describe('LBL basic infiltration model (docs/methods.md#lbl-infiltration, ASHRAE Handbook—Fundamentals Ch. 16)', () => {
  it('#13: 416.66 cm², 2 storeys, class 3, 36 K, 6.7 m/s → 60.105 L/s; sensible 2661.5 W', () => {
    assertClose(lblInfiltrationLps(416.66, 2, 3, 36, 6.7), 60.105, 1e-3, 'L/s'); // [C] docs/methods.md#check-values
    const b = building({
      conduction: { mode: 'ua', uaWPerK: 1 },
      airLeakage: { mode: 'ela', elaCm2: 416.66, storeys: 2, shieldingClass: 3 },
    });
    assertClose(heatLoss(b, -15, 6.7).infiltrationW, 2661.5, 0.1, 'W'); // [C] docs/methods.md#lbl-infiltration
  });

  it('a case by hand with the table coefficients: 300 cm², 1 storey, class 4, 30 K, 4 m/s', () => {
    // C_s(1 storey) = 0.000145 [M], C_w(class 4, 1 storey) = 0.000104 [S], docs/methods.md#lbl-infiltration:
    // Q = 300·√(0.000145·30 + 0.000104·4²) = 300·√(0.004350 + 0.001664) = 23.2650 L/s [C].
    const q = 300 * Math.sqrt(0.000145 * 30 + 0.000104 * 16);
    assertClose(q, 23.265, 1e-4, 'hand value');
    assertClose(lblInfiltrationLps(300, 1, 4, 30, 4), q, 1e-9, 'engine');
    // |Δt| in the stack term: the sign of Δt does not change the flow.
    assert.equal(lblInfiltrationLps(300, 1, 4, -30, 4), lblInfiltrationLps(300, 1, 4, 30, 4));
  });

  it('the coefficient tables are those of docs/methods.md#lbl-infiltration', () => {
    // Stack coefficient, SI [M in docs/methods.md#lbl-infiltration].
    assert.deepEqual(STACK_COEFFICIENT_SI, { 1: 0.000145, 2: 0.00029, 3: 0.000435 });
    // Wind coefficient, SI: ASHRAE 1989 Fundamentals table via a CRC Press textbook companion [S].
    assert.deepEqual(WIND_COEFFICIENT_SI, {
      1: { 1: 0.000319, 2: 0.00042, 3: 0.000494 },
      2: { 1: 0.000246, 2: 0.000325, 3: 0.000382 },
      3: { 1: 0.000174, 2: 0.000231, 3: 0.000271 },
      4: { 1: 0.000104, 2: 0.000137, 3: 0.000161 },
      5: { 1: 0.000032, 2: 0.000042, 3: 0.000049 },
    });
  });

  it('converted to IP units, the SI tables match the IP columns of docs/methods.md#lbl-infiltration', () => {
    // Q_cfm = A_in²·√(C_IP·Δt_F + …): C_s,IP = C_s,SI·(cfm per L/s)² / ((in² per cm²)²·(°F per K)),
    // C_w,IP = C_w,SI·(cfm per L/s)² / ((in² per cm²)²·(mph per m/s)²).
    const cfmPerLps = fromSi('airflow', 1, 'IP');
    const in2PerCm2 = fromSi('leakageArea', 1, 'IP');
    const fPerK = 1 / toSiClimate('temperatureDifference', 1, 'IP');
    const mphPerMs = 1 / toSiClimate('speed', 1, 'IP');
    const stackIp = { 1: 0.015, 2: 0.0299, 3: 0.0449 } as const; // [M] docs/methods.md#lbl-infiltration, consistent within 0.7 %
    for (const s of [1, 2, 3] as const) {
      const converted = (STACK_COEFFICIENT_SI[s] * cfmPerLps ** 2) / (in2PerCm2 ** 2 * fPerK);
      assert.ok(Math.abs(converted / stackIp[s] - 1) < 0.007, `C_s ${s} storeys: ${converted} vs ${stackIp[s]}`);
    }
    const windIp = {
      1: [0.0119, 0.0157, 0.0184],
      2: [0.0092, 0.0121, 0.0143],
      3: [0.0065, 0.0086, 0.0101],
      4: [0.0039, 0.0051, 0.006],
      5: [0.0012, 0.0016, 0.0018],
    } as const; // [S] docs/methods.md#lbl-infiltration IP columns (4 decimals)
    for (const c of [1, 2, 3, 4, 5] as const) {
      for (const s of [1, 2, 3] as const) {
        const converted = (WIND_COEFFICIENT_SI[c][s] * cfmPerLps ** 2) / (in2PerCm2 ** 2 * mphPerMs ** 2);
        assertClose(converted, windIp[c][s - 1] ?? Number.NaN, 0.00005, `C_w class ${c}, ${s} storeys`);
      }
    }
  });
});

describe('heat loss: ventilation, duct loss, gains and safety factor', () => {
  const b = building({
    indoorDesignC: 21,
    conduction: {
      mode: 'envelope',
      components: [
        { label: 'Walls', areaM2: 100, rValue: 3.15 },
        { label: 'Windows', areaM2: 10, uValue: 1.6 },
      ],
    },
    airLeakage: { mode: 'ach', ach: 0.5, volumeM3: 400 },
    ventilation: { flowLps: 30, heatRecoveryEffectiveness: 0.7 },
    ductLossPct: 15,
    safetyFactorPct: 10,
    internalGainsW: 500,
  });

  it('adds the parts as docs/methods.md#heat-loss, #duct-loss-and-margins describe', () => {
    // [C] by hand at −15 °C (ΔT 36 K):
    const ua = 100 / 3.15 + 10 * 1.6; // 47.746 W/K
    const inf = 1.23 * ((0.5 * 400) / 3.6); // 68.333 W/K
    const vent = 1.23 * 30 * (1 - 0.7); // 11.07 W/K
    const base = (ua + inf + vent) * 36;
    const total = base * 1.15;
    const r = heatLoss(b, -15, 6.7);
    assertClose(r.conductanceWPerK.conduction, ua, 1e-9, 'UA');
    assertClose(r.conductanceWPerK.infiltration, inf, 1e-9, 'infiltration W/K');
    assertClose(r.conductanceWPerK.ventilation, vent, 1e-9, 'ventilation W/K');
    assertClose(r.conductanceWPerK.total, ua + inf + vent, 1e-9, 'total W/K');
    assertClose(r.ventilationW, vent * 36, 1e-9, 'ventilation W');
    assertClose(r.ductW, base * 0.15, 1e-9, 'duct W');
    assertClose(r.totalW, total, 1e-9, 'total W');
    assert.equal(r.internalGainsW, 500);
    assertClose(r.loadW, total - 500, 1e-9, 'L');
    // Gains are not credited at design by default (docs/methods.md#design-load): D = total × 1.1.
    assertClose(r.designLoadW, total * 1.1, 1e-9, 'D');
    assertClose(
      heatLoss({ ...b, creditGainsAtDesign: true }, -15, 6.7).designLoadW,
      (total - 500) * 1.1,
      1e-9,
      'D with gains credited',
    );
    assertClose(total, 5263.98, 0.01, 'total W, by hand'); // 127.14937 W/K × 36 K × 1.15
  });

  it('without the design credit, the design load never falls when the gains rise', () => {
    let previous = -Infinity;
    for (const internalGainsW of [0, 200, 500, 1000, 5000]) {
      const d = heatLoss({ ...b, internalGainsW }, -15, 6.7).designLoadW;
      assert.ok(d >= previous, `design load fell to ${d} W with ${internalGainsW} W of gains`);
      previous = d;
    }
    // …and with it, it does fall: the setting is what changes the outcome.
    assert.ok(heatLoss({ ...b, internalGainsW: 1000, creditGainsAtDesign: true }, -15, 6.7).designLoadW < previous);
  });

  it('is zero when it is as warm outside as inside, and gains never make the load negative', () => {
    const r = heatLoss(b, 25, 6.7);
    assert.equal(r.totalW, 0);
    assert.equal(r.loadW, 0);
    assert.equal(r.designLoadW, 0);
    const mild = heatLoss(b, 19, 6.7);
    assert.ok(mild.totalW > 0 && mild.totalW < 500);
    assert.equal(mild.loadW, 0);
  });
});

describe('thermal time constant (docs/methods.md#indoor-temperature)', () => {
  it('uses the hours given', () => {
    assert.equal(timeConstantHours({ mode: 'hours', timeConstantH: 42 }, 250), 42);
  });

  it('class × floor area ÷ conductance: 150 m² medium = 24.75 MJ/K; at 250 W/K → 27.5 h', () => {
    // [M] ISO 13790 classes as listed in docs/methods.md#indoor-temperature: light 110 000, medium 165 000, heavy 260 000 J/(m²·K).
    assert.deepEqual(THERMAL_CAPACITANCE_J_PER_M2K, { light: 110_000, medium: 165_000, heavy: 260_000 });
    // [C] docs/methods.md#indoor-temperature: 150 m² medium → 24.75 MJ/K; τ = 24.75e6 / 250 / 3600 = 27.5 h.
    assertClose(timeConstantHours({ mode: 'class', class: 'medium', floorAreaM2: 150 }, 250), 27.5, 1e-9, 'τ');
    // [C] docs/methods.md#indoor-temperature / #18: C = 30 MJ/K, UA = 250 W/K → τ = 33.333 h (heavy: 30e6/260 000 m²).
    assertClose(
      timeConstantHours({ mode: 'class', class: 'heavy', floorAreaM2: 30e6 / 260_000 }, 250),
      33.333,
      1e-3,
      'τ',
    );
    assert.throws(() => timeConstantHours({ mode: 'class', class: 'light', floorAreaM2: 100 }, 0), RangeError);
  });
});

describe('design wind choice', () => {
  const wind = { coincident99_6: 2.2, coldestMonth1: 11.6, annual1: 12.8 };

  it('takes the chosen climate value, the 6.7 m/s default, or a custom speed', () => {
    // 6.7 m/s (15 mph) is a common trade default, no source (docs/methods.md#trade-facts).
    assert.equal(DEFAULT_DESIGN_WIND_MS, 6.7);
    assert.deepEqual(resolveDesignWind({ source: 'coincident99_6' }, wind), {
      windMs: 2.2,
      source: 'coincident99_6',
      fellBack: false,
    });
    assert.deepEqual(resolveDesignWind({ source: 'coldestMonth1' }, wind), {
      windMs: 11.6,
      source: 'coldestMonth1',
      fellBack: false,
    });
    assert.deepEqual(resolveDesignWind({ source: 'default' }, wind), {
      windMs: 6.7,
      source: 'default',
      fellBack: false,
    });
    assert.deepEqual(resolveDesignWind({ source: 'custom', customMs: 4 }, null), {
      windMs: 4,
      source: 'custom',
      fellBack: false,
    });
  });

  it('falls back to the default, and says so, when the site lacks the value', () => {
    assert.deepEqual(resolveDesignWind({ source: 'coldestMonth1' }, { coldestMonth1: null }), {
      windMs: 6.7,
      source: 'default',
      fellBack: true,
    });
  });
});

describe('building schema', () => {
  const minimal = {
    conduction: { mode: 'ua', uaWPerK: 150 },
    airLeakage: { mode: 'ach', ach: 0.3, volumeM3: 350 },
    thermalMass: { mode: 'class', class: 'medium', floorAreaM2: 140 },
  };

  it('fills in the defaults of a new building', () => {
    const b = buildingSchema.parse(minimal);
    assert.equal(b.indoorDesignC, 21); // common practice, no source
    assert.deepEqual(b.designWind, { source: 'default' });
    assert.deepEqual(b.ventilation, { flowLps: 0, heatRecoveryEffectiveness: 0 });
    assert.equal(b.ductLossPct, 0);
    assert.equal(b.safetyFactorPct, 0);
    assert.equal(b.internalGainsW, 0);
    assert.equal(BUILDING_DEFAULTS.indoorDesignC, 21);
  });

  const firstIssue = (input: unknown) => {
    const r = buildingSchema.safeParse(input);
    assert.ok(!r.success, 'expected the input to be refused');
    return r.error.issues;
  };

  it('wants exactly one of U or R for each envelope element', () => {
    const both = firstIssue({
      ...minimal,
      conduction: { mode: 'envelope', components: [{ label: 'Roof', areaM2: 80, uValue: 0.2, rValue: 5 }] },
    });
    assert.deepEqual(both[0]?.path, ['conduction', 'components', 0, 'rValue']);
    assert.match(both[0]?.message ?? '', /not both/);
    const neither = firstIssue({
      ...minimal,
      conduction: { mode: 'envelope', components: [{ label: 'Roof', areaM2: 80 }] },
    });
    assert.match(neither[0]?.message ?? '', /U-value or an R-value/);
    const empty = firstIssue({ ...minimal, conduction: { mode: 'envelope', components: [] } });
    assert.match(empty[0]?.message ?? '', /at least one envelope element/);
  });

  it('explains bad leakage, wind, ventilation and thermal-mass fields', () => {
    const storeys = firstIssue({ ...minimal, airLeakage: { mode: 'ela', elaCm2: 400, storeys: 4, shieldingClass: 3 } });
    assert.deepEqual(storeys[0]?.path, ['airLeakage', 'storeys']);
    assert.match(storeys[0]?.message ?? '', /1, 2 or 3/);
    const shielding = firstIssue({
      ...minimal,
      airLeakage: { mode: 'ela', elaCm2: 400, storeys: 2, shieldingClass: 6 },
    });
    assert.match(shielding[0]?.message ?? '', /shielding class/);
    const mode = firstIssue({ ...minimal, airLeakage: { mode: 'cfm50' } });
    assert.match(mode[0]?.message ?? '', /ACH50/);
    const custom = firstIssue({ ...minimal, designWind: { source: 'custom' } });
    assert.deepEqual(custom[0]?.path, ['designWind', 'customMs']);
    const hrv = firstIssue({ ...minimal, ventilation: { flowLps: 30, heatRecoveryEffectiveness: 0.97 } });
    assert.match(hrv[0]?.message ?? '', /at most 0\.95/);
    const mass = firstIssue({ ...minimal, thermalMass: { mode: 'class', class: 'medium' } });
    assert.deepEqual(mass[0]?.path, ['thermalMass', 'floorAreaM2']);
    const indoor = firstIssue({ ...minimal, indoorDesignC: 40 });
    assert.match(indoor[0]?.message ?? '', /at most 35 °C/);
  });
});

describe('properties (fast-check)', () => {
  const achLeakage = fc.oneof(
    fc.record({
      mode: fc.constant('ach' as const),
      ach: fc.double({ min: 0, max: 3, noNaN: true }),
      volumeM3: fc.double({ min: 50, max: 3000, noNaN: true }),
    }),
    fc.record({
      mode: fc.constant('ach50' as const),
      ach50: fc.double({ min: 0, max: 20, noNaN: true }),
      volumeM3: fc.double({ min: 50, max: 3000, noNaN: true }),
      nFactor: fc.double({ min: 10, max: 30, noNaN: true }),
    }),
  );
  const elaLeakage = fc.record({
    mode: fc.constant('ela' as const),
    elaCm2: fc.double({ min: 0, max: 3000, noNaN: true }),
    storeys: fc.constantFrom(1 as const, 2 as const, 3 as const),
    shieldingClass: fc.constantFrom(1 as const, 2 as const, 3 as const, 4 as const, 5 as const),
  });
  const rest = {
    indoorDesignC: fc.double({ min: 15, max: 25, noNaN: true }),
    conduction: fc.record({ mode: fc.constant('ua' as const), uaWPerK: fc.double({ min: 1, max: 2000, noNaN: true }) }),
    ventilation: fc.record({
      flowLps: fc.double({ min: 0, max: 200, noNaN: true }),
      heatRecoveryEffectiveness: fc.double({ min: 0, max: 0.95, noNaN: true }),
    }),
    ductLossPct: fc.double({ min: 0, max: 40, noNaN: true }),
    safetyFactorPct: fc.double({ min: 0, max: 40, noNaN: true }),
    internalGainsW: fc.double({ min: 0, max: 2000, noNaN: true }),
    thermalMass: fc.constant({ mode: 'hours' as const, timeConstantH: 30 }),
    designWind: fc.constant({ source: 'default' as const }),
  };
  const achBuilding = fc.record({ ...rest, airLeakage: achLeakage }).map((b) => buildingSchema.parse(b));
  const elaBuilding = fc.record({ ...rest, airLeakage: elaLeakage }).map((b) => buildingSchema.parse(b));
  const anyBuilding = fc.oneof(achBuilding, elaBuilding);

  it('with ACH or ACH50 leakage, the heat loss is linear in ΔT and independent of wind', () => {
    fc.assert(
      fc.property(
        achBuilding,
        fc.double({ min: 0.1, max: 60, noNaN: true }),
        fc.double({ min: 0.1, max: 5, noNaN: true }),
        fc.double({ min: 0, max: 20, noNaN: true }),
        (b, dT, k, wind) => {
          const one = heatLoss(b, b.indoorDesignC - dT, wind).totalW;
          const scaled = heatLoss(b, b.indoorDesignC - k * dT, 0).totalW;
          return Math.abs(scaled - k * one) <= 1e-9 * Math.max(1, Math.abs(k * one));
        },
      ),
    );
  });

  it('every term is non-negative at any outdoor temperature and wind', () => {
    fc.assert(
      fc.property(
        anyBuilding,
        fc.double({ min: -60, max: 45, noNaN: true }),
        fc.double({ min: 0, max: 30, noNaN: true }),
        (b, t, w) => {
          const r = heatLoss(b, t, w);
          return [r.conductionW, r.infiltrationW, r.ventilationW, r.ductW, r.totalW, r.loadW, r.designLoadW].every(
            (x) => x >= 0,
          );
        },
      ),
    );
  });

  it('with ELA leakage, the heat loss does not fall as the wind rises', () => {
    fc.assert(
      fc.property(
        elaBuilding,
        fc.double({ min: -40, max: 20, noNaN: true }),
        fc.double({ min: 0, max: 20, noNaN: true }),
        fc.double({ min: 0, max: 10, noNaN: true }),
        (b, t, w, extra) => heatLoss(b, t, w + extra).totalW >= heatLoss(b, t, w).totalW,
      ),
    );
  });
});
