import { jStat } from "./jstat";

/**
 * Upper tail of the F distribution, P(F(df1, df2) > F), through the regularised incomplete beta
 * function: P = I_x(df2/2, df1/2) with x = df2/(df2 + df1·F) (Abramowitz & Stegun 1964, 26.6.2;
 * jstat's ibeta). Reading the upper tail directly keeps small p exact to more digits than 1 − cdf.
 *
 * Cost: O(1) (a continued fraction).
 * @throws never; null when F is not a finite number ≥ 0 or a df is not positive.
 * @example fUpperTail(5.014, 2, 18) // 0.01858…
 */
export function fUpperTail(F: number, df1: number, df2: number): number | null {
  if (!Number.isFinite(F) || F < 0 || !(df1 > 0) || !(df2 > 0)) return null;
  if (F === 0) return 1;
  return jStat.ibeta(df2 / (df2 + df1 * F), df2 / 2, df1 / 2);
}
