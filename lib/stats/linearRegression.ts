import { linearRegression, linearRegressionLine, rSquared } from "simple-statistics";

export interface RegressionLine {
  intercept: number | null;
  slope: number | null;
  r2: number | null;
  /** Why the line (or r²) is null, else null. */
  note: string | null;
}

/**
 * Least-squares line y = intercept + slope·x with r², via simple-statistics (ordinary least
 * squares, any statistics text). Used for the Fitts regression MT = a + b·ID. Not computable
 * (null, with a note) with fewer than 2 points, a value that is not finite, or all x equal; r² is
 * null when all y are equal.
 *
 * Cost: O(n).
 * @throws Error when the arrays differ in length.
 * @example leastSquaresLine([1, 2, 3], [2, 4, 6.5]) // {intercept: -0.3333…, slope: 2.25, r2: 0.9959…, note: null}
 */
export function leastSquaresLine(x: readonly number[], y: readonly number[]): RegressionLine {
  if (x.length !== y.length) throw new Error("leastSquaresLine requires arrays of equal length");
  const none = (note: string): RegressionLine => ({ intercept: null, slope: null, r2: null, note });
  if (x.length < 2) return none(`needs at least 2 points, has ${x.length}`);
  if (![...x, ...y].every(Number.isFinite)) return none("a point is not finite");
  if (x.every((v) => v === x[0])) return none("every point has the same x");
  const pairs = x.map((xi, i) => [xi, y[i]!]);
  const fit = linearRegression(pairs);
  const r2 = y.every((v) => v === y[0]) ? null : rSquared(pairs, linearRegressionLine(fit));
  return { intercept: fit.b, slope: fit.m, r2, note: r2 === null ? "every point has the same y: r² is undefined" : null };
}
