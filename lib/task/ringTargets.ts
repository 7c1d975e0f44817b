import type { Point } from "./point";

/**
 * Ring target layout: the centres of n targets spaced evenly on a circle of the given diameter.
 *
 * Used by the multi-directional tapping task (ISO 9241-411:2012, Annex B; common practice: n odd,
 * usually 9–25). Target 0 sits at the top of the circle (screen coordinates, y down) and the
 * indices run clockwise on screen.
 *
 * Cost: O(n).
 * @throws Error when n is not an odd integer ≥ 3 or the diameter is not a positive finite number.
 * @example ringTargets(3, 2) // [{x: 0, y: -1}, {x: 0.866…, y: 0.5}, {x: -0.866…, y: 0.5}]
 */
export function ringTargets(n: number, diameter: number, centre: Point = { x: 0, y: 0 }): Point[] {
  if (!Number.isInteger(n) || n < 3 || n % 2 === 0) {
    throw new Error(`ringTargets requires an odd number of targets ≥ 3, got ${n}`);
  }
  if (!(diameter > 0) || !Number.isFinite(diameter)) {
    throw new Error(`ringTargets requires a positive diameter, got ${diameter}`);
  }
  const radius = diameter / 2;
  const targets: Point[] = [];
  for (let i = 0; i < n; i++) {
    const angle = -Math.PI / 2 + (2 * Math.PI * i) / n;
    targets.push({ x: centre.x + radius * Math.cos(angle), y: centre.y + radius * Math.sin(angle) });
  }
  return targets;
}
