/** Types for the parts of the npm package `psychrolib` (1.1.1, MIT) that the engine tests call. */
declare module 'psychrolib' {
  interface Psychrolib {
    readonly SI: number;
    readonly IP: number;
    SetUnitSystem(unitSystem: number): void;
    GetSatVapPres(tDryBulb: number): number;
    GetStandardAtmPressure(altitude: number): number;
    GetHumRatioFromTDewPoint(tDewPoint: number, pressure: number): number;
    GetHumRatioFromVapPres(vapPres: number, pressure: number): number;
    GetRelHumFromHumRatio(tDryBulb: number, humRatio: number, pressure: number): number;
    GetRelHumFromTDewPoint(tDryBulb: number, tDewPoint: number): number;
  }
  const psychrolib: Psychrolib;
  export default psychrolib;
}
