import { mean, sampleStandardDeviation } from "simple-statistics";
import { jStat } from "./jstat";

export interface PairedTResult {
  meanDiff: number;
  t: number;
  df: number;
  /** Two-sided p. */
  p: number;
  /** Cohen's d_z = mean difference / SD of the differences. */
  dz: number;
}

/**
 * Paired (dependent-samples) t-test of a − b: t = d̄/(s_d/√n), df = n − 1, two-sided p from
 * Student's t (jstat), and the effect size d_z = d̄/s_d (Cohen 1988, §2.3.5).
 *
 * Cost: O(n).
 * @throws Error when the arrays differ in length or hold fewer than 2 pairs.
 * @example pairedT([3, 5, 7], [1, 2, 3]) // {meanDiff: 3, t: 5.196…, df: 2, p: 0.0351…, dz: 3}
 */
export function pairedT(a: readonly number[], b: readonly number[]): PairedTResult {
  if (a.length !== b.length) throw new Error("pairedT requires arrays of equal length");
  if (a.length < 2) throw new Error("pairedT requires at least 2 pairs");
  const d = a.map((x, i) => x - b[i]!);
  const meanDiff = mean(d);
  const sd = sampleStandardDeviation(d);
  const df = d.length - 1;
  const t = meanDiff / (sd / Math.sqrt(d.length));
  const p = Number.isFinite(t) ? 2 * (1 - jStat.studentt.cdf(Math.abs(t), df)) : sd === 0 && meanDiff === 0 ? Number.NaN : 0;
  return { meanDiff, t, df, p, dz: meanDiff / sd };
}
