import assert from 'node:assert/strict';
import { describe, it } from 'node:test';
import psy from 'psychrolib';
import {
  humidityRatioFromDewPoint,
  humidityRatioFromVapourPressure,
  relativeHumidityFromHumidityRatio,
  saturationVapourPressurePa,
  standardPressurePa,
} from '../../shared/climate/psychrometrics';
import { assertClose } from './close-to';

psy.SetUnitSystem(psy.SI);

describe('psychrometrics (ASHRAE Handbook—Fundamentals 2017, Ch. 1)', () => {
  it('standard atmospheric pressure, Eq. 3', () => {
    // ASHRAE Handbook—Fundamentals 2017, Ch. 1, Eq. 3 [S]; values docs/methods.md#psychrometrics [P = C]
    assertClose(standardPressurePa(0), 101325, 0.01, 'p(0 m)');
    assertClose(standardPressurePa(2), 101301.0, 0.05, 'p(2 m)'); // San Francisco table standard pressure [S]
    assertClose(standardPressurePa(1000), 89874.52, 0.01, 'p(1000 m)');
    assertClose(standardPressurePa(1500), 84555.93, 0.01, 'p(1500 m)');
  });

  it('saturation vapour pressure, Eqs. 5 (ice) and 6 (water)', () => {
    // ASHRAE Handbook—Fundamentals 2017, Ch. 1, Eqs. 5/6 [S]; values docs/methods.md#psychrometrics, #check-values [P and C]
    assertClose(saturationVapourPressurePa(20), 2338.8, 0.01, 'p_ws(20 °C)');
    assertClose(saturationVapourPressurePa(21), 2487.67, 0.01, 'p_ws(21 °C)');
    assertClose(saturationVapourPressurePa(0), 611.15, 0.01, 'p_ws(0 °C), ice');
    assertClose(saturationVapourPressurePa(-10), 259.9, 0.01, 'p_ws(−10 °C), ice');
    assertClose(saturationVapourPressurePa(-20), 103.26, 0.01, 'p_ws(−20 °C), ice');
    // at the triple point itself the ice branch still applies: psychrolib GetSatVapPres(0.01) = 611.65702, docs/methods.md#psychrometrics [P]
    assertClose(saturationVapourPressurePa(0.01), 611.65702, 1e-4, 'p_ws(0.01 °C)');
  });

  it('humidity ratio (Eq. 20) and relative humidity (Eq. 22) check values', () => {
    // docs/methods.md#psychrometrics [P = C]
    assertClose(humidityRatioFromVapourPressure(611.2, 101325), 0.0037743863, 1e-10, 'W(611.2 Pa)');
    assertClose(relativeHumidityFromHumidityRatio(-5, 0.0015, 101325), 0.60679, 1e-5, 'φ(−5 °C, 1.5 g/kg)');
    assertClose(relativeHumidityFromHumidityRatio(-5, 0.0015, standardPressurePa(1500)), 0.50637, 1e-5, 'φ at 1500 m');
    assertClose(relativeHumidityFromHumidityRatio(-10, 0.001, 101325), 0.62583, 1e-5, 'φ(−10 °C, 1 g/kg)');
    assertClose(relativeHumidityFromHumidityRatio(20, 0.0073, 101325), 0.5026, 1e-5, 'φ(20 °C, 7.3 g/kg)');
    assertClose(humidityRatioFromDewPoint(-20, 101325), 0.00063447118, 1e-11, 'W(DP −20 °C)');
  });

  it('San Francisco humidification row: DP −3.7 °C at 101 301 Pa → 2.767 g/kg (table 2.8)', () => {
    // ASHRAE Handbook—Fundamentals 2009, Ch. 14 row for WMO 724940 [S]: DP 99.6 % −3.7 °C, HR 2.8 g/kg,
    // MCDB 10.7 °C; ice-branch value 2.767 g/kg and φ 34.87 % per docs/methods.md#humidification, #psychrometrics [S + C]
    const w = humidityRatioFromDewPoint(-3.7, 101301);
    assertClose(w * 1000, 2.767, 0.001, 'W g/kg');
    assertClose(w * 1000, 2.8, 0.05, 'W vs the one-decimal table value');
    assertClose(relativeHumidityFromHumidityRatio(10.7, w, 101301) * 100, 34.87, 0.01, 'φ at MCDB %');
    // DP 99 % −1.2 °C → 3.416 g/kg, table 3.4 [S + C]
    assertClose(humidityRatioFromDewPoint(-1.2, 101301) * 1000, 3.416, 0.001, 'W(−1.2 °C) g/kg');
  });

  it('agrees with psychrolib over a temperature sweep including sub-zero values', () => {
    // npm psychrolib 1.1.1 (PsychroLib 2.5.0, implementing ASHRAE Handbook—Fundamentals 2017, Ch. 1), called live [P]
    for (let t = -60; t <= 50; t += 0.37) {
      const expected = psy.GetSatVapPres(t);
      assertClose(saturationVapourPressurePa(t), expected, expected * 1e-12, `p_ws(${t.toFixed(2)})`);
    }
    for (const z of [-200, 0, 2, 250, 500, 1000, 1609, 2500, 4000]) {
      assertClose(standardPressurePa(z), psy.GetStandardAtmPressure(z), 1e-8, `p(${z} m)`);
    }
    for (const p of [101325, 95000, 84556, 70000]) {
      for (let dp = -45; dp <= 30; dp += 1.3) {
        const expectedW = psy.GetHumRatioFromTDewPoint(dp, p);
        const w = humidityRatioFromDewPoint(dp, p);
        assertClose(w, expectedW, expectedW * 1e-12, `W(${dp.toFixed(1)} °C, ${p} Pa)`);
        const db = dp + 7.5;
        assertClose(
          relativeHumidityFromHumidityRatio(db, w, p),
          psy.GetRelHumFromHumRatio(db, w, p),
          1e-12,
          `φ(${db.toFixed(1)} °C)`,
        );
      }
    }
  });

  it('switches from ice to water at the triple point', () => {
    // ASHRAE Handbook—Fundamentals 2017, Ch. 1, Eqs. 5/6: over ice p_ws(0 °C) = 611.15 Pa, over water
    // 611.21 Pa (docs/methods.md#psychrometrics [P/C]); the ice value is used at 0 °C
    assert.ok(Math.abs(saturationVapourPressurePa(0) - 611.21) > 0.03);
    assert.ok(saturationVapourPressurePa(0.02) > saturationVapourPressurePa(0.01));
  });
});
