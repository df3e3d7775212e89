/** Unit conversions used by the readers. All factors are exact by definition. */

/** °F → °C: t_C = (t_F − 32) · 5/9 (exact, from the definitions of both scales). */
export function fahrenheitToCelsius(tF: number): number {
  return ((tF - 32) * 5) / 9;
}

/** °C → °F (exact). */
export function celsiusToFahrenheit(tC: number): number {
  return (tC * 9) / 5 + 32;
}

/** 1 mph = 0.44704 m/s exactly (1 mile = 1609.344 m by the 1959 international yard). */
export const METRES_PER_SECOND_PER_MPH = 0.44704;

/** 1 knot = 1852 m per 3600 s exactly (1 international nautical mile = 1852 m). */
export const METRES_PER_SECOND_PER_KNOT = 1852 / 3600;

/** mph → m/s. */
export function mphToMs(mph: number): number {
  return mph * METRES_PER_SECOND_PER_MPH;
}

/** knots → m/s. */
export function knotsToMs(knots: number): number {
  return knots * METRES_PER_SECOND_PER_KNOT;
}
