/**
 * Ring nominal amplitude: the chord between two targets visited in a row on a ring of n targets,
 * A = D·cos(π/(2n)) — slightly less than the diameter D (ISO 9241-411:2012, Annex B; common
 * practice).
 *
 * Cost: O(1).
 * @throws Error when n is not an odd integer ≥ 3 or the diameter is not positive.
 * @example ringAmplitude(13, 512) // 508.2669…
 */
export function ringAmplitude(n: number, diameter: number): number {
  if (!Number.isInteger(n) || n < 3 || n % 2 === 0) {
    throw new Error(`ringAmplitude requires an odd number of targets ≥ 3, got ${n}`);
  }
  if (!(diameter > 0) || !Number.isFinite(diameter)) {
    throw new Error(`ringAmplitude requires a positive diameter, got ${diameter}`);
  }
  return diameter * Math.cos(Math.PI / (2 * n));
}
