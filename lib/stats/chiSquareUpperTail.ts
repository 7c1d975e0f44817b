import { jStat } from "./jstat";

/**
 * Upper tail of the χ² distribution, P(χ²(df) > x) = 1 − P(df/2, x/2) with P the regularised lower
 * incomplete gamma function (Abramowitz & Stegun 1964, 26.4.19; jstat's lowRegGamma).
 *
 * Cost: O(1).
 * @throws never; null when x is not a finite number ≥ 0 or df is not positive.
 * @example chiSquareUpperTail(30, 5) // 1.4748…e-5
 */
export function chiSquareUpperTail(x: number, df: number): number | null {
  if (!Number.isFinite(x) || x < 0 || !(df > 0)) return null;
  return 1 - jStat.lowRegGamma(df / 2, x / 2);
}
