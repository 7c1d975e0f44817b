/**
 * Ring visiting order: the target indices of one multi-directional sequence, k·(n+1)/2 mod n for
 * k = 0..n, so that every hop crosses the circle (ISO 9241-411:2012, Annex B; common practice).
 *
 * The result has n + 1 entries: the first selection only starts the clock, so a sequence has n
 * movements, and the last entry returns to target 0.
 *
 * Cost: O(n).
 * @throws Error when n is not an odd integer ≥ 3.
 * @example ringVisitingOrder(5) // [0, 3, 1, 4, 2, 0]
 */
export function ringVisitingOrder(n: number): number[] {
  if (!Number.isInteger(n) || n < 3 || n % 2 === 0) {
    throw new Error(`ringVisitingOrder requires an odd number of targets ≥ 3, got ${n}`);
  }
  const step = (n + 1) / 2;
  const order: number[] = [];
  for (let k = 0; k <= n; k++) order.push((k * step) % n);
  return order;
}
