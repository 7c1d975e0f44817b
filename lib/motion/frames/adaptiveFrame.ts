/**
 * Horizontal rate in the adaptive frame (adaptiveFrameHorizontal).
 *
 * Purpose: blend the screen-up (y) and screen-normal (z) rates by where gravity points in the
 * y–z plane, so it works held flat or upright (common practice: suits most people with a separate
 * controller). By Cauchy–Schwarz |h| ≤ |(ω_y, ω_z)|. With gravity along x (device on its side)
 * it falls back to the screen-normal rate. Source: science.md §8 "adaptive". Cost: O(1).
 * @throws never.
 * @example adaptiveFrameHorizontal(30, 40, 0, 1) // 40 (held flat: the screen-normal rate)
 */
export function adaptiveFrameHorizontal(rateY: number, rateZ: number, upY: number, upZ: number): number {
  const n = Math.sqrt(upY * upY + upZ * upZ);
  if (n < 1e-6) return rateZ;
  return (rateY * upY + rateZ * upZ) / n;
}
