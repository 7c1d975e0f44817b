/**
 * Nominal index of difficulty, Shannon form: ID = log2(A/W + 1) bits (MacKenzie 1992, HCI 7:91–139;
 * ISO 9241-411:2012).
 *
 * Cost: O(1).
 * @throws Error when amplitude < 0 or width ≤ 0.
 * @example nominalIndexOfDifficulty(256, 32) // 3.1699…
 */
export function nominalIndexOfDifficulty(amplitude: number, width: number): number {
  if (!(width > 0) || !Number.isFinite(width)) {
    throw new Error(`nominalIndexOfDifficulty requires a positive width, got ${width}`);
  }
  if (!(amplitude >= 0) || !Number.isFinite(amplitude)) {
    throw new Error(`nominalIndexOfDifficulty requires a non-negative amplitude, got ${amplitude}`);
  }
  return Math.log2(amplitude / width + 1);
}
