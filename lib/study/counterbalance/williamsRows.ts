import { assertConditionCount } from "./assertConditionCount";

/**
 * Balanced Latin square (williamsRows): condition orders balanced for position and for
 * first-order carry-over.
 *
 * Source: Williams, E. J. (1949), "Experimental designs balanced for the estimation of residual
 * effects of treatments", Australian Journal of Scientific Research A 2(3):149–168. First row
 * 0, 1, n−1, 2, n−2, 3, …; row r adds r to every entry (mod n). For even n the n rows hold every
 * ordered pair of neighbours exactly once; for odd n each row is followed by its reverse
 * (2n rows), which holds every ordered pair of neighbours exactly twice.
 * Every condition appears once per position (per n rows for even n, twice per 2n rows for odd n).
 * n = 1 gives the single row [0] (reversing it adds nothing).
 *
 * Cost: O(n²) time and space.
 * @throws Error when n is not a whole number from 1 to 64.
 * @example williamsRows(4) // [[0,1,3,2],[1,2,0,3],[2,3,1,0],[3,0,2,1]]
 * @example williamsRows(3) // [[0,1,2],[1,2,0],[2,0,1],[2,1,0],[0,2,1],[1,0,2]]
 */
export function williamsRows(n: number): number[][] {
  assertConditionCount("williamsRows", n);
  if (n === 1) return [[0]];
  const first: number[] = [0];
  for (let k = 1, low = 1, high = n - 1; k < n; k++) first.push(k % 2 === 1 ? low++ : high--);
  const rows = Array.from({ length: n }, (_, r) => first.map((c) => (c + r) % n));
  if (n % 2 === 0) return rows;
  return [...rows, ...rows.map((row) => [...row].reverse())];
}
