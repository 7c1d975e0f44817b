import { assertConditionCount } from "./assertConditionCount";

/**
 * Cyclic Latin square (cyclicRows): n orders in which every condition appears once per row and
 * once per column (position), cell (r, c) = (r + c) mod n. Balances position, not carry-over
 * (common practice; see Williams 1949 for the balanced alternative).
 *
 * Cost: O(n²) time and space.
 * @throws Error when n is not a whole number from 1 to 64.
 * @example cyclicRows(3) // [[0,1,2],[1,2,0],[2,0,1]]
 */
export function cyclicRows(n: number): number[][] {
  assertConditionCount("cyclicRows", n);
  return Array.from({ length: n }, (_, r) => Array.from({ length: n }, (_, c) => (r + c) % n));
}
