/**
 * Unit conversions of building and equipment quantities against NIST SP 811 (2008 ed.,
 * "Guide for the Use of the International System of Units", Appendix B.8, factors for units listed
 * alphabetically), and the sensible-heat factors of ASHRAE Handbook—Fundamentals Ch. 18 (docs/methods.md#air-heat).
 *
 * Tags (docs/methods.md): [S] confirmed in a source found during this work, [M] quoted from memory,
 * [C] computed from the formula shown.
 */
import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import { quantities, formatQuantity, fromSi, toSi, unitLabel, type Quantity } from '../../shared/units/units';
import { SENSIBLE_HEAT_FACTOR_BTUH_PER_CFM_F, SENSIBLE_HEAT_FACTOR_W_PER_LPS_K } from '../../shared/building/heat-loss';
import { toSi as toSiClimate } from '../../shared/units/units';
import { assertClose } from './close-to';

describe('NIST SP 811 (2008) Appendix B.8 factors through the engine conversions', () => {
  it('1 Btu_IT/h = 2.930 711 E−01 W', () => {
    // [S, secondary]: NIST SP 811 App. B.8 gives 1 Btu_IT = 1.055 056 E+03 J (reproduced in a
    // handbook table of SP 811 factors); per hour: 1055.056 / 3600 = 0.293 071 1 W [C].
    assertClose(toSi('power', 1, 'IP'), 0.2930711, 5e-8, 'W per Btu/h');
    assertClose(toSi('power', 1, 'IP'), 1055.056 / 3600, 5e-8, 'W per Btu/h from Btu_IT');
    assertClose(
      fromSi('power', 1000, 'IP'),
      3412.142,
      1e-3,
      'Btu/h per kW (docs/methods.md#units: 1 W = 3.412142 Btu/h [S])',
    );
  });

  it('1 ft³/min = 4.719 474 E−04 m³/s = 0.471 947 4 L/s', () => {
    // [M] NIST SP 811 App. B.8, "cubic foot per minute (ft³/min) → cubic meter per second".
    assertClose(toSi('airflow', 1, 'IP'), 0.4719474, 5e-8, 'L/s per cfm');
    // docs/methods.md#units: 1 L/s = 2.118880 cfm [C].
    assertClose(fromSi('airflow', 1, 'IP'), 2.11888, 5e-6, 'cfm per L/s');
    // m³/h: 1 cfm = 0.4719474 L/s × 3.6 = 1.699011 m³/h [C].
    assertClose(toSi('airflowHourly', 1, 'IP'), 0.4719474 * 3.6, 1e-6, 'm³/h per cfm');
  });

  it('1 ft = 0.3048 m exactly; 1 ft² = 9.290 304 E−02 m²; 1 ft³ = 2.831 685 E−02 m³', () => {
    // [S] international foot (1959), exact; NIST SP 811 App. B.8 lists it in bold (exact).
    assert.equal(toSiClimate('length', 1, 'IP'), 0.3048);
    // [C] 0.3048² and 0.3048³ (App. B.8 lists 9.290 304 E−02 exact and 2.831 685 E−02 [M]).
    assertClose(toSi('area', 1, 'IP'), 0.09290304, 1e-12, 'm² per ft²');
    assertClose(toSi('volume', 1, 'IP'), 0.02831685, 5e-9, 'm³ per ft³');
  });

  it('a temperature difference of 1 °F = 5/9 K', () => {
    // [S] definition of the Fahrenheit and Rankine scales (NIST SP 811 §4.2.1.1 and App. B.8 [M for section numbers]).
    assertClose(toSiClimate('temperatureDifference', 1, 'IP'), 5 / 9, 1e-12, 'K per °F difference');
  });

  it('1 Btu_IT/(h·ft²·°F) = 5.678 263 W/(m²·K); R: 1 h·ft²·°F/Btu = 0.176 110 m²·K/W', () => {
    // [M] NIST SP 811 App. B.8; docs/methods.md#units gives both values [C].
    assertClose(toSi('uValue', 1, 'IP'), 5.678263, 5e-7, 'U-value');
    assertClose(toSi('rValue', 1, 'IP'), 0.17611, 5e-7, 'R-value');
    // [C] a Btu/(h·°F) conductance: 0.2930711 W × 1.8 °F/K = 0.5275280 W/K.
    assertClose(toSi('conductance', 1, 'IP'), 0.2930711 * 1.8, 1e-7, 'conductance');
    // [C] 1 in² = 6.4516 cm² exactly (2.54 cm per inch).
    assertClose(toSi('leakageArea', 1, 'IP'), 6.4516, 1e-12, 'cm² per in²');
  });

  it('round-trips every quantity and leaves SI values alone', () => {
    for (const q of Object.keys(quantities) as Quantity[]) {
      assert.equal(toSi(q, 123.4, 'SI'), 123.4);
      assertClose(toSi(q, fromSi(q, 123.4, 'IP'), 'IP'), 123.4, 1e-9, q);
      assert.notEqual(unitLabel(q, 'SI'), '');
    }
  });

  it('formats values with their unit label', () => {
    assert.equal(formatQuantity('power', 1000, 'SI'), '1000 W');
    assert.equal(formatQuantity('power', 1000, 'IP'), '3412 Btu/h');
    assert.equal(formatQuantity('airflow', 55.5556, 'IP'), '118 cfm');
    assert.equal(formatQuantity('uValue', null, 'SI'), '—');
    assert.equal(formatQuantity('conductance', -0.01, 'SI'), '0.0 W/K');
  });
});

describe('sensible-heat factor (ASHRAE Handbook—Fundamentals Ch. 18; docs/methods.md#air-heat)', () => {
  // The factor converts as W/(L/s·K) ↔ Btu/h per (cfm·°F): × (W→Btu/h) × (L/s per cfm) × (K per °F).
  const siToIp = (f: number) =>
    f * fromSi('power', 1, 'IP') * toSi('airflow', 1, 'IP') * toSiClimate('temperatureDifference', 1, 'IP');

  it('1.23 W/(L/s·K) is 1.1004 Btu/(h·cfm·°F), and 1.08 Btu/(h·cfm·°F) is 1.2072 W/(L/s·K)', () => {
    assert.equal(SENSIBLE_HEAT_FACTOR_W_PER_LPS_K, 1.23); // [S] ASHRAE Fundamentals Ch. 18 via docs/methods.md#air-heat
    assert.equal(SENSIBLE_HEAT_FACTOR_BTUH_PER_CFM_F, 1.08); // [S] same
    assertClose(siToIp(1.23), 1.1004, 1e-4, '1.23 in IP'); // docs/methods.md#air-heat cross-unit check [C]
    assertClose(1.08 / siToIp(1), 1.2072, 1e-4, '1.08 in SI'); // [C]
  });

  it('the two are the same air property within 2 %: ρ·c_p·(flow unit) in each system', () => {
    // 1.23 = 0.001 m³/s × 1.2 kg/m³ × 1026 J/(kg·K) [C, docs/methods.md#air-heat];
    // 1.08 = 0.075 lb/ft³ × 60 min/h × 0.240 Btu/(lb·°F) [C]. They differ by the rounding of the
    // assumed density and specific heat (moist vs dry air), not by the conversion.
    assertClose(0.001 * 1.2 * 1026, 1.23, 0.002, 'SI derivation');
    assertClose(0.075 * 60 * 0.24, 1.08, 1e-12, 'IP derivation');
    const ratio = siToIp(SENSIBLE_HEAT_FACTOR_W_PER_LPS_K) / SENSIBLE_HEAT_FACTOR_BTUH_PER_CFM_F;
    assert.ok(ratio > 1 && ratio < 1.02, `1.23 in IP / 1.08 = ${ratio}`);
  });

  it('docs/methods.md#air-heat checks: 125 cfm × 70 °F → 9450 Btu/h with 1.08, 9625 Btu/h with 1.23 (≈ 1.10 in IP)', () => {
    const ip = 1.08 * 125 * 70; // [C] docs/methods.md#air-heat: 9450 Btu/h
    assert.equal(ip, 9450);
    const siW =
      SENSIBLE_HEAT_FACTOR_W_PER_LPS_K * toSi('airflow', 125, 'IP') * toSiClimate('temperatureDifference', 70, 'IP');
    // With 1.23 the SI route gives the 1.10 value: 9625 Btu/h (docs/methods.md#air-heat) within 0.1 %.
    assertClose(fromSi('power', siW, 'IP'), 9625, 10, 'SI route in Btu/h');
  });
});
