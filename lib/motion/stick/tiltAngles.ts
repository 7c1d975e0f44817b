const RAD = 180 / Math.PI;

/**
 * Sideways tilt from the "up" vector (tiltSidewaysDeg).
 *
 * Purpose: for tilt-rate control: the angle of the screen x axis above the horizontal,
 * asin(ĝ_x), in degrees; lowering the right edge makes it negative, held flat or upright.
 * Source: geometry of the unit "up" vector (science.md §8). Cost: O(1).
 * @throws never.
 * @example tiltSidewaysDeg(-0.5) // -30.000000000000004
 */
export function tiltSidewaysDeg(upX: number): number {
  return Math.asin(upX > 1 ? 1 : upX < -1 ? -1 : upX) * RAD;
}

/**
 * Forward tilt from the "up" vector (tiltForwardDeg).
 *
 * Purpose: the angle of "up" in the device y–z plane, atan2(ĝ_y, ĝ_z): 0 held flat, 90 held
 * upright; raising the top edge (positive rate about x) increases it. Source: geometry of the
 * unit "up" vector. Cost: O(1).
 * @throws never.
 * @example tiltForwardDeg(1, 0) // 90
 */
export function tiltForwardDeg(upY: number, upZ: number): number {
  return Math.atan2(upY, upZ) * RAD;
}
