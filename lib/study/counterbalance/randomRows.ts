import { assertConditionCount } from "./assertConditionCount";
import { seededUniform } from "./seededUniform";

/**
 * Random condition orders from a recorded seed (randomRows): `count` independent uniform
 * permutations of 0..n−1, each by the Fisher–Yates shuffle (Durstenfeld 1964, CACM 7(7):420,
 * "Algorithm 235: Random permutation") driven by seededUniform(seed). The same seed always gives
 * the same rows, so the stored seed reproduces every participant's order.
 *
 * Cost: O(n · count).
 * @throws Error when n is not a whole number from 1 to 64, count is not a whole number from 1 to
 *   100 000, or the seed is not a whole number from 0 to 2³¹−1.
 * @example randomRows(3, 1, 2) // [[2,0,1],[0,2,1]]
 */
export function randomRows(n: number, seed: number, count: number): number[][] {
  assertConditionCount("randomRows", n);
  if (!Number.isInteger(count) || count < 1 || count > 100_000) throw new Error(`randomRows requires a row count from 1 to 100000, got ${count}`);
  if (!Number.isInteger(seed) || seed < 0 || seed > 2 ** 31 - 1) throw new Error(`randomRows requires a whole-number seed from 0 to 2^31-1, got ${seed}`);
  const next = seededUniform(seed);
  return Array.from({ length: count }, () => {
    const row = Array.from({ length: n }, (_, i) => i);
    for (let i = n - 1; i > 0; i--) {
      const j = Math.floor(next() * (i + 1));
      [row[i], row[j]] = [row[j]!, row[i]!];
    }
    return row;
  });
}
