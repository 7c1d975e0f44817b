/**
 * Speed after a dead band (speedAfterDeadBand).
 *
 * Purpose: a dead band ignores rotation slower than `deadBand` and subtracts it from faster
 * rotation, so output is continuous at the edge. Large dead bands are a common fault (common
 * practice); studies add them to measure the harm. Source: science.md §8. Cost: O(1).
 * @throws never.
 * @example speedAfterDeadBand(12, 2) // 10
 */
export function speedAfterDeadBand(speed: number, deadBand: number): number {
  return speed > deadBand ? speed - deadBand : 0;
}
