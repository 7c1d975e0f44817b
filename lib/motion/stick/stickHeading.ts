/**
 * Stick heading in degrees (stickHeadingDeg).
 *
 * Purpose: the heading stick's angle relative to forward, atan2(x, −y): 0 = pushed up
 * (W3C Gamepad y is down positive), 90 = right, −90 = left, ±180 = down. Source: science.md §8
 * "Heading stick"; W3C Gamepad standard mapping (axis signs). Cost: O(1).
 * @throws never.
 * @example stickHeadingDeg(1, 0) // 90
 */
export function stickHeadingDeg(x: number, y: number): number {
  return (Math.atan2(x, -y) * 180) / Math.PI;
}

/**
 * Wrap an angle difference into (−180, 180] degrees (wrapAngleDeg).
 *
 * Purpose: turning the stick around its rim past "down" must not produce a 360° jump.
 * Source: standard angle arithmetic. Cost: O(1).
 * @throws never.
 * @example wrapAngleDeg(350) // -10
 */
export function wrapAngleDeg(a: number): number {
  let r = a % 360;
  if (r > 180) r -= 360;
  else if (r <= -180) r += 360;
  return r;
}
