import { mean, sampleStandardDeviation } from "simple-statistics";
import { jStat } from "./jstat";

/** Mean, sample SD (n − 1) and a two-sided t confidence interval; null where undefined (n < 2). */
export interface IntervalSummary {
  mean: number | null;
  sd: number | null;
  ci95: [number | null, number | null];
}

/**
 * Student t confidence interval of a mean: mean ± t(1 − α/2, n − 1)·s/√n, with s the sample SD
 * (any statistics text, e.g. Student 1908; quantile from jstat). With no value everything is null;
 * with one value the SD and the interval are null.
 *
 * Cost: O(n).
 * @throws never.
 * @example tInterval([1, 2, 3]) // {mean: 2, sd: 1, ci95: [-0.4841…, 4.4841…]}
 */
export function tInterval(values: readonly number[], level = 0.95): IntervalSummary {
  if (values.length === 0) return { mean: null, sd: null, ci95: [null, null] };
  const m = mean(values as number[]);
  if (values.length < 2) return { mean: m, sd: null, ci95: [null, null] };
  const sd = sampleStandardDeviation(values as number[]);
  const half = jStat.studentt.inv(1 - (1 - level) / 2, values.length - 1) * (sd / Math.sqrt(values.length));
  return { mean: m, sd, ci95: [m - half, m + half] };
}
