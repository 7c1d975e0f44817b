import type { Point } from "./point";

/** One strip of the one-directional task: its centre, its width along the task axis, the axis. */
export interface StripTarget {
  readonly centre: Point;
  readonly width: number;
  /** Unit vector of the task axis (from the first strip towards the second). */
  readonly axis: Point;
}

/**
 * Strip targets of the one-directional tapping task: two strips of width W whose centres lie
 * `amplitude` apart along an axis through `centre` at `angleRad` (0 = horizontal, left to right)
 * (ISO 9241-411:2012, one-directional tapping; common practice).
 *
 * Cost: O(1).
 * @throws Error when amplitude or width is not positive, or width ≥ amplitude (strips overlap).
 * @example stripTargets(200, 20) // [{centre: {x: -100, y: 0}, width: 20, axis: {x: 1, y: 0}}, {centre: {x: 100, y: 0}, …}]
 */
export function stripTargets(
  amplitude: number,
  width: number,
  centre: Point = { x: 0, y: 0 },
  angleRad = 0,
): [StripTarget, StripTarget] {
  if (!(amplitude > 0) || !Number.isFinite(amplitude)) {
    throw new Error(`stripTargets requires a positive amplitude, got ${amplitude}`);
  }
  if (!(width > 0) || !Number.isFinite(width)) {
    throw new Error(`stripTargets requires a positive width, got ${width}`);
  }
  if (width >= amplitude) {
    throw new Error(`stripTargets requires width < amplitude, got ${width} ≥ ${amplitude}`);
  }
  const axis = { x: Math.cos(angleRad), y: Math.sin(angleRad) };
  const half = amplitude / 2;
  return [
    { centre: { x: centre.x - half * axis.x, y: centre.y - half * axis.y }, width, axis },
    { centre: { x: centre.x + half * axis.x, y: centre.y + half * axis.y }, width, axis },
  ];
}
