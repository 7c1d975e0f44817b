/**
 * Weight of the unsmoothed input in fine-aim smoothing (fineAimDirectWeight).
 *
 * Purpose: fine-aim smoothing smooths only slow input; at or above `thresholdSpeed` the input
 * passes unchanged (weight 1), below it the weight falls linearly to 0 at rest. Heavy smoothing
 * is a common fault (common practice), so it stays off the fast part. Source: science.md §8
 * ("fine-aim smoothing on the slow part"). Cost: O(1).
 * @throws never.
 * @example fineAimDirectWeight(2.5, 10) // 0.25
 */
export function fineAimDirectWeight(speed: number, thresholdSpeed: number): number {
  return speed >= thresholdSpeed ? 1 : speed / thresholdSpeed;
}

/**
 * Exponential smoothing factor for a time step (exponentialSmoothingFactor).
 *
 * Purpose: α = Δt/(τ + Δt) for a first-order low-pass with time constant τ, valid for uneven
 * sample intervals. Source: discretised first-order RC filter (standard). Cost: O(1).
 * @throws never.
 * @example exponentialSmoothingFactor(10, 30) // 0.25
 */
export function exponentialSmoothingFactor(dtMs: number, timeConstantMs: number): number {
  if (timeConstantMs <= 0) return 1;
  return dtMs / (timeConstantMs + dtMs);
}
