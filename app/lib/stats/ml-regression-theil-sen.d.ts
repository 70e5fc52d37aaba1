// ml-regression-theil-sen 3.0.0 ships no types; only the test cross-check uses it (the engine has its own).
declare module "ml-regression-theil-sen" {
  export class TheilSenRegression {
    constructor(x: readonly number[], y: readonly number[]);
    readonly slope: number;
    readonly intercept: number;
  }
}
