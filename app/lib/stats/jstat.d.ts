// jstat 1.9.6 ships no types; this declares only the parts the engine uses.
declare module "jstat" {
  interface ContinuousDistribution {
    cdf(x: number, ...parameters: number[]): number;
    inv(p: number, ...parameters: number[]): number;
  }
  interface JStat {
    normal: ContinuousDistribution;
    studentt: ContinuousDistribution;
    gammaln(x: number): number;
  }
  const jStat: JStat;
  export default jStat;
}
