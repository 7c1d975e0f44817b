import { mean, sampleVariance } from "simple-statistics";
import { jStat } from "./jstat";

export interface WelchTResult {
  meanDiff: number;
  t: number | null;
  /** Welch–Satterthwaite degrees of freedom. */
  df: number | null;
  /** Two-sided p. */
  p: number | null;
  /** Cohen's d with the root mean square of the two SDs, (m_a − m_b)/√((s_a² + s_b²)/2). */
  d: number | null;
  note: string | null;
}

/**
 * Welch's t-test of two independent samples (unequal variances; Welch 1947, Biometrika 34:28–35):
 * t = (m_a − m_b)/√(s_a²/n_a + s_b²/n_b), df = (s_a²/n_a + s_b²/n_b)² / Σ (s_i²/n_i)²/(n_i − 1),
 * two-sided p from Student's t (jstat); d with the root mean square of the SDs (Cohen 1988 §2.5,
 * from memory). When neither sample varies t cannot be computed: null.
 *
 * Cost: O(n_a + n_b).
 * @throws Error when a sample has fewer than 2 values.
 * @example welchT([3.1, 2.8, 3.6, 3.3, 2.9, 3.4], [3.9, 4.4, 3.5, 4.8, 4.1]).t // -3.7753…
 */
export function welchT(a: readonly number[], b: readonly number[]): WelchTResult {
  if (a.length < 2 || b.length < 2) throw new Error("welchT requires at least 2 values in each sample");
  const meanDiff = mean(a as number[]) - mean(b as number[]);
  const va = sampleVariance(a as number[]);
  const vb = sampleVariance(b as number[]);
  const se2 = va / a.length + vb / b.length;
  if (!(se2 > 0)) return { meanDiff, t: null, df: null, p: null, d: null, note: "neither sample varies: t cannot be computed" };
  const t = meanDiff / Math.sqrt(se2);
  const df = (se2 * se2) / ((va / a.length) ** 2 / (a.length - 1) + (vb / b.length) ** 2 / (b.length - 1));
  return { meanDiff, t, df, p: 2 * (1 - jStat.studentt.cdf(Math.abs(t), df)), d: meanDiff / Math.sqrt((va + vb) / 2), note: null };
}
