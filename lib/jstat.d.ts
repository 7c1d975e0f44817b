// jstat ships no types: the few functions the project uses.
declare module "jstat" {
  interface Distribution {
    cdf(x: number, ...params: number[]): number;
    inv(p: number, ...params: number[]): number;
    pdf(x: number, ...params: number[]): number;
  }
  export const jStat: {
    normal: { cdf(x: number, mean: number, sd: number): number; inv(p: number, mean: number, sd: number): number; pdf(x: number, mean: number, sd: number): number };
    studentt: { cdf(x: number, df: number): number; inv(p: number, df: number): number; pdf(x: number, df: number): number };
    centralF: { cdf(x: number, df1: number, df2: number): number; inv(p: number, df1: number, df2: number): number; pdf(x: number, df1: number, df2: number): number };
    chisquare: { cdf(x: number, df: number): number; inv(p: number, df: number): number; pdf(x: number, df: number): number };
    /** (value − mean(sample)) / (sample SD / √n), sample SD with n − 1. */
    tscore(value: number, sample: number[]): number;
    /** Regularised incomplete beta function I_x(a, b). */
    ibeta(x: number, a: number, b: number): number;
    /** Regularised lower incomplete gamma function P(a, x). */
    lowRegGamma(a: number, x: number): number;
    /** p of the one-sample t-test of `value` against `sample`; sides 1 or 2. */
    ttest(value: number, sample: number[], sides: 1 | 2): number;
  } & Record<string, unknown>;
  const jStatDefault: typeof jStat;
  export default jStatDefault;
}
