/** Types for the parts of the npm packages `ml-regression-theil-sen` (3.0.0, MIT) and `jstat` (1.9.6, MIT) that the engine tests call. */
declare module 'ml-regression-theil-sen' {
  export class TheilSenRegression {
    constructor(x: number[], y: number[]);
    readonly slope: number;
    readonly intercept: number;
  }
}
declare module 'jstat' {
  interface JStat {
    normal: { cdf(x: number, mean: number, sd: number): number };
  }
  const jStat: JStat;
  export default jStat;
}
