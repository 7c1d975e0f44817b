import { linearRegression, linearRegressionLine, rSquared } from "simple-statistics";

export interface RegressionLine {
  intercept: number;
  slope: number;
  r2: number;
}

/**
 * Least-squares line y = intercept + slope·x with r², via simple-statistics (ordinary least
 * squares, any statistics text). Used for the Fitts regression MT = a + b·ID.
 *
 * Cost: O(n).
 * @throws Error when the arrays differ in length or hold fewer than 2 points. With all x equal the
 *   slope is NaN.
 * @example leastSquaresLine([1, 2, 3], [2, 4, 6.5]) // {intercept: -0.3333…, slope: 2.25, r2: 0.9972…}
 */
export function leastSquaresLine(x: readonly number[], y: readonly number[]): RegressionLine {
  if (x.length !== y.length) throw new Error("leastSquaresLine requires arrays of equal length");
  if (x.length < 2) throw new Error("leastSquaresLine requires at least 2 points");
  const pairs = x.map((xi, i) => [xi, y[i]!]);
  const allSameX = x.every((v) => v === x[0]);
  if (allSameX) return { intercept: Number.NaN, slope: Number.NaN, r2: Number.NaN };
  const fit = linearRegression(pairs);
  const r2 = rSquared(pairs, linearRegressionLine(fit));
  return { intercept: fit.b, slope: fit.m, r2 };
}
