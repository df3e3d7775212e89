/** Climate engine: design conditions from hourly weather records, data quality, readers and demo data. */
export * from './design-conditions';
export * from './design-conditions-schema';
export * from './demo-weather';
export * from './extremes';
export * from './hourly-series';
export * from './percentile';
export * from './prepared-series';
export * from './psychrometrics';
export * from './quality-report';
export {
  celsiusToFahrenheit,
  fahrenheitToCelsius,
  knotsToMs,
  METRES_PER_SECOND_PER_KNOT,
  METRES_PER_SECOND_PER_MPH,
  mphToMs,
} from '../units/units';
export * from './readers/index';
export * from './record-window';
export * from './shift-stretch';
export * from './trend';
