import { mean, sampleStandardDeviation } from "simple-statistics";
import { jStat } from "./jstat";

export interface PairedTResult {
  meanDiff: number;
  t: number | null;
  df: number;
  /** Two-sided p. */
  p: number | null;
  /** Cohen's d_z = mean difference / SD of the differences. */
  dz: number | null;
  /** Why t, p and d_z are null, else null. */
  note: string | null;
}

/**
 * Paired (dependent-samples) t-test of a − b: t = d̄/(s_d/√n), df = n − 1, two-sided p from
 * Student's t (jstat), and the effect size d_z = d̄/s_d (Cohen 1988, §2.3.5). When the differences
 * do not vary (s_d = 0) t, p and d_z cannot be computed and are null.
 *
 * Cost: O(n).
 * @throws Error when the arrays differ in length or hold fewer than 2 pairs.
 * @example pairedT([3, 5, 7], [1, 2, 3]) // {meanDiff: 3, t: 5.196…, df: 2, p: 0.0351…, dz: 3, note: null}
 */
export function pairedT(a: readonly number[], b: readonly number[]): PairedTResult {
  if (a.length !== b.length) throw new Error("pairedT requires arrays of equal length");
  if (a.length < 2) throw new Error("pairedT requires at least 2 pairs");
  const d = a.map((x, i) => x - b[i]!);
  const meanDiff = mean(d);
  const sd = sampleStandardDeviation(d);
  const df = d.length - 1;
  if (!(sd > 0)) return { meanDiff, t: null, df, p: null, dz: null, note: "the differences do not vary: t cannot be computed" };
  const t = meanDiff / (sd / Math.sqrt(d.length));
  return { meanDiff, t, df, p: 2 * (1 - jStat.studentt.cdf(Math.abs(t), df)), dz: meanDiff / sd, note: null };
}
