/**
 * Psychrometric relations in SI units, from ASHRAE Handbook—Fundamentals 2017, Ch. 1
 * (Psychrometrics). Temperatures in °C, pressures in Pa, humidity ratio in kg water per kg dry air.
 */

/** Sea-level standard atmospheric pressure, Pa (ASHRAE Handbook—Fundamentals 2017, Ch. 1, Eq. 3). */
export const STANDARD_SEA_LEVEL_PRESSURE_PA = 101_325;

/** Triple point of water, °C: below it saturation is taken over ice (Eq. 5), above it over water (Eq. 6). */
export const TRIPLE_POINT_WATER_C = 0.01;

/** Ratio of the molecular masses of water vapour and dry air used in Eq. 20. */
export const MOLECULAR_MASS_RATIO = 0.621945;

const ZERO_CELSIUS_K = 273.15;

/**
 * Standard atmospheric pressure at an elevation, Pa:
 * p = 101 325 · (1 − 2.25577×10⁻⁵ · Z)^5.2559, Z in m (ASHRAE Handbook—Fundamentals 2017, Ch. 1, Eq. 3).
 */
export function standardPressurePa(elevationM: number): number {
  return STANDARD_SEA_LEVEL_PRESSURE_PA * Math.pow(1 - 2.25577e-5 * elevationM, 5.2559);
}

/**
 * Saturation vapour pressure, Pa, Hyland–Wexler form (ASHRAE Handbook—Fundamentals 2017, Ch. 1):
 * over ice (Eq. 5) at or below the triple point 0.01 °C, over liquid water (Eq. 6) above it.
 * Valid from −100 °C to +200 °C.
 */
export function saturationVapourPressurePa(tC: number): number {
  const t = tC + ZERO_CELSIUS_K;
  if (tC <= TRIPLE_POINT_WATER_C) {
    const lnP =
      -5.6745359e3 / t +
      6.3925247 +
      -9.677843e-3 * t +
      6.2215701e-7 * t * t +
      2.0747825e-9 * t * t * t +
      -9.484024e-13 * t * t * t * t +
      4.1635019 * Math.log(t);
    return Math.exp(lnP);
  }
  const lnP =
    -5.8002206e3 / t +
    1.3914993 +
    -4.8640239e-2 * t +
    4.1764768e-5 * t * t +
    -1.4452093e-8 * t * t * t +
    6.5459673 * Math.log(t);
  return Math.exp(lnP);
}

/** Humidity ratio, kg/kg, from the water-vapour partial pressure and total pressure (Eq. 20). */
export function humidityRatioFromVapourPressure(vapourPressurePa: number, pressurePa: number): number {
  return (MOLECULAR_MASS_RATIO * vapourPressurePa) / (pressurePa - vapourPressurePa);
}

/** Water-vapour partial pressure, Pa, from the humidity ratio and total pressure (Eq. 20 solved for p_w). */
export function vapourPressureFromHumidityRatio(humidityRatio: number, pressurePa: number): number {
  return (pressurePa * humidityRatio) / (MOLECULAR_MASS_RATIO + humidityRatio);
}

/**
 * Humidity ratio, kg/kg, of air at a dew point: p_w = p_ws(t_dp) (over ice below the triple point),
 * then Eq. 20.
 */
export function humidityRatioFromDewPoint(dewPointC: number, pressurePa: number): number {
  return humidityRatioFromVapourPressure(saturationVapourPressurePa(dewPointC), pressurePa);
}

/**
 * Relative humidity, 0–1, of air with humidity ratio W at dry-bulb t: φ = p_w / p_ws(t)
 * (ASHRAE Handbook—Fundamentals 2017, Ch. 1, Eq. 22, with p_w from Eq. 20).
 */
export function relativeHumidityFromHumidityRatio(dryBulbC: number, humidityRatio: number, pressurePa: number): number {
  return vapourPressureFromHumidityRatio(humidityRatio, pressurePa) / saturationVapourPressurePa(dryBulbC);
}
