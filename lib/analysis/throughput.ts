/**
 * Throughput TP = IDe/MT in bits/s for one sequence, MT the mean movement time given in ms
 * (ISO 9241-411:2012; Soukoreff & MacKenzie 2004: per sequence, then the mean of means).
 *
 * Cost: O(1).
 * @throws Error when the movement time is not positive.
 * @example throughput(3.2, 800) // 4
 */
export function throughput(ide: number, movementTimeMs: number): number {
  if (!(movementTimeMs > 0)) throw new Error(`throughput requires a positive movement time, got ${movementTimeMs}`);
  return ide / (movementTimeMs / 1000);
}
