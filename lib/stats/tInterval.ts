import { mean, sampleStandardDeviation } from "simple-statistics";
import { jStat } from "./jstat";

/** Mean, sample SD (n − 1) and a two-sided t confidence interval. NaN where undefined (n < 2). */
export interface IntervalSummary {
  mean: number;
  sd: number;
  ci95: [number, number];
}

/**
 * Student t confidence interval of a mean: mean ± t(1 − α/2, n − 1)·s/√n, with s the sample SD
 * (any statistics text, e.g. Student 1908; quantile from jstat).
 *
 * Cost: O(n).
 * @throws Error when values is empty. With one value, sd and the interval are NaN.
 * @example tInterval([1, 2, 3]) // {mean: 2, sd: 1, ci95: [-0.4841…, 4.4841…]}
 */
export function tInterval(values: readonly number[], level = 0.95): IntervalSummary {
  if (values.length === 0) throw new Error("tInterval requires at least 1 value");
  const m = mean(values as number[]);
  if (values.length < 2) return { mean: m, sd: Number.NaN, ci95: [Number.NaN, Number.NaN] };
  const sd = sampleStandardDeviation(values as number[]);
  const half = jStat.studentt.inv(1 - (1 - level) / 2, values.length - 1) * (sd / Math.sqrt(values.length));
  return { mean: m, sd, ci95: [m - half, m + half] };
}
