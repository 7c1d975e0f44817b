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
  } & Record<string, unknown>;
  const jStatDefault: typeof jStat;
  export default jStatDefault;
}
