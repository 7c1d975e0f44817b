/**
 * Horizontal rate in the gravity frame: rotation about the true vertical (gravityFrameHorizontal).
 *
 * Purpose: h = ω·ĝ, with ĝ the unit "up" vector in the screen frame (the direction of
 * accelerationIncludingGravity at rest). Source: science.md §8 "gravity". Cost: O(1).
 * @param upX..upZ a unit vector. @throws never.
 * @example gravityFrameHorizontal(0, 30, 40, 0, 0.6, 0.8) // 50
 */
export function gravityFrameHorizontal(rateX: number, rateY: number, rateZ: number, upX: number, upY: number, upZ: number): number {
  return rateX * upX + rateY * upY + rateZ * upZ;
}

/**
 * Vertical rate in the gravity frame (gravityFrameVertical).
 *
 * Purpose: v = ω·r̂, r̂ = the screen x axis with its ĝ component removed, normalised; when the
 * x axis is (nearly) vertical it falls back to ω_x. Source: science.md §8 "gravity". Cost: O(1).
 * @throws never.
 * @example gravityFrameVertical(10, 0, 0, 0, 1, 0) // 10
 */
export function gravityFrameVertical(rateX: number, rateY: number, rateZ: number, upX: number, upY: number, upZ: number): number {
  const rx = 1 - upX * upX, ry = -upX * upY, rz = -upX * upZ;
  const n = Math.sqrt(rx * rx + ry * ry + rz * rz);
  if (n < 1e-6) return rateX;
  return (rateX * rx + rateY * ry + rateZ * rz) / n;
}
