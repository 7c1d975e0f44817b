import { MAX_ALL_ORDERS_CONDITIONS } from "./conditionLimit";

/**
 * Every order of n conditions (allOrders): the n! permutations of 0..n−1 in lexicographic order,
 * for complete counterbalancing of small designs (common practice: only for at most 4
 * conditions, 24 orders; beyond that the participant count explodes).
 *
 * Cost: O(n · n!) time and space.
 * @throws Error when n is not a whole number from 1 to 4.
 * @example allOrders(3) // [[0,1,2],[0,2,1],[1,0,2],[1,2,0],[2,0,1],[2,1,0]]
 */
export function allOrders(n: number): number[][] {
  if (!Number.isInteger(n) || n < 1 || n > MAX_ALL_ORDERS_CONDITIONS) throw new Error(`allOrders requires 1 to ${MAX_ALL_ORDERS_CONDITIONS} conditions, got ${n}`);
  const out: number[][] = [];
  const walk = (prefix: number[], rest: number[]): void => {
    if (rest.length === 0) {
      out.push(prefix);
      return;
    }
    rest.forEach((c, i) => walk([...prefix, c], [...rest.slice(0, i), ...rest.slice(i + 1)]));
  };
  walk([], Array.from({ length: n }, (_, i) => i));
  return out;
}
