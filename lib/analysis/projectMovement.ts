import type { Point } from "../task/point";
import { taskAxis, type Geometry } from "./taskAxis";

/** Where a movement's start point S comes from. */
export type StartPoint = "actual" | "nominal";

export interface MovementProjection {
  /** a = |T − S| (sphere: the great-circle angle). */
  a: number;
  /** dx: the signed deviation of P from T along the axis: + overshoot, − undershoot. */
  dx: number;
  /** The movement's distance along the task axis, a + dx. */
  distance: number;
  /** |P − T| (sphere: the great-circle angle), the end point's distance from the target centre. */
  endError: number;
  /** P's signed distance from the task axis. */
  across: number;
}

/**
 * Projects one movement onto its task axis: with S the start, T the target centre and P the
 * selection point, a = |T − S|, dx = (P − T)·(T − S)/a, distance = a + dx (ISO 9241-411:2012;
 * MacKenzie 1992; the start S is the previous selection point, "actual", or the previous target's
 * centre, "nominal"). In a plane by default; on the view sphere with `geometry` "sphere" (taskAxis).
 *
 * Cost: O(1).
 * @throws Error when S coincides with T (no task axis).
 * @example projectMovement(0, 0, 100, 0, 104, 3) // {a: 100, dx: 4, distance: 104, endError: 5, across: 3}
 */
export function projectMovement(sx: number, sy: number, tx: number, ty: number, px: number, py: number, geometry: Geometry = "plane"): MovementProjection {
  if (geometry === "sphere") {
    const axis = taskAxis("sphere", { x: sx, y: sy }, { x: tx, y: ty });
    const p: Point = { x: px, y: py };
    const distance = axis.along(p);
    return { a: axis.length, dx: distance - axis.length, distance, endError: axis.between(p, { x: tx, y: ty }), across: axis.across(p) };
  }
  const ux = tx - sx;
  const uy = ty - sy;
  const a = Math.hypot(ux, uy);
  if (!(a > 0)) throw new Error("projectMovement requires a start point apart from the target centre");
  const ex = px - tx;
  const ey = py - ty;
  const dx = (ex * ux + ey * uy) / a;
  return { a, dx, distance: a + dx, endError: Math.hypot(ex, ey), across: (-ex * uy + ey * ux) / a };
}
