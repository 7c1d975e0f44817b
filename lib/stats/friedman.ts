import { chiSquareUpperTail } from "./chiSquareUpperTail";

export interface FriedmanResult {
  /** Friedman's chi-squared, corrected for ties; null when no subject's values differ. */
  statistic: number | null;
  df: number;
  p: number | null;
  n: number;
  k: number;
}

/**
 * Friedman's rank test for k related samples (Friedman 1937, JASA 32:675–701): rank each subject's
 * k values (ties get mid-ranks), Q = [12/(n·k·(k+1))·ΣR_j² − 3n(k+1)] / [1 − Σ(t³ − t)/(n(k³ − k))],
 * df = k − 1, p from the χ² distribution (jstat). Used for error rates, which are not normal. When
 * every subject's values are all tied the statistic cannot be computed: null.
 *
 * Cost: O(n·k log k).
 * @throws Error when fewer than 2 subjects or 2 conditions, rows differ in length or a value is not finite.
 * @example friedman([[1, 2, 3], [1, 3, 2], [1, 2, 3]]) // {statistic: 4.6667, df: 2, p: 0.0970, n: 3, k: 3}
 */
export function friedman(data: readonly (readonly number[])[]): FriedmanResult {
  const n = data.length;
  if (n < 2) throw new Error("friedman requires at least 2 subjects");
  const k = data[0]!.length;
  if (k < 2) throw new Error("friedman requires at least 2 conditions");
  const rankSums = new Array<number>(k).fill(0);
  let tieSum = 0;
  for (const row of data) {
    if (row.length !== k) throw new Error("friedman requires the same number of conditions for every subject");
    if (row.some((v) => !Number.isFinite(v))) throw new Error("friedman requires finite values");
    const order = row.map((v, i) => ({ v, i })).sort((a, b) => a.v - b.v);
    let start = 0;
    while (start < k) {
      let end = start;
      while (end + 1 < k && order[end + 1]!.v === order[start]!.v) end++;
      const midRank = (start + end) / 2 + 1;
      for (let j = start; j <= end; j++) rankSums[order[j]!.i]! += midRank;
      const t = end - start + 1;
      tieSum += t * t * t - t;
      start = end + 1;
    }
  }
  const raw = (12 / (n * k * (k + 1))) * rankSums.reduce((s, r) => s + r * r, 0) - 3 * n * (k + 1);
  const correction = 1 - tieSum / (n * (k * k * k - k));
  const statistic = correction > 0 ? raw / correction : null;
  const df = k - 1;
  return { statistic, df, p: statistic === null ? null : chiSquareUpperTail(statistic, df), n, k };
}
