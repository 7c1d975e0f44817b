/** Where a movement's start point S comes from. */
export type StartPoint = "actual" | "nominal";

export interface MovementProjection {
  /** a = |T − S|. */
  a: number;
  /** dx = (P − T)·(T − S)/a, signed: + overshoot, − undershoot. */
  dx: number;
  /** The movement's distance along the task axis, a + dx. */
  distance: number;
  /** |P − T|, the end point's distance from the target centre. */
  endError: number;
}

/**
 * Projects one movement onto its task axis: with S the start, T the target centre and P the
 * selection point, a = |T − S|, dx = (P − T)·(T − S)/a, distance = a + dx (ISO 9241-411:2012;
 * MacKenzie 1992; the start S is the previous selection point, "actual", or the previous target's
 * centre, "nominal").
 *
 * Cost: O(1).
 * @throws Error when S coincides with T (no task axis).
 * @example projectMovement(0, 0, 100, 0, 104, 3) // {a: 100, dx: 4, distance: 104, endError: 5}
 */
export function projectMovement(sx: number, sy: number, tx: number, ty: number, px: number, py: number): MovementProjection {
  const ux = tx - sx;
  const uy = ty - sy;
  const a = Math.hypot(ux, uy);
  if (!(a > 0)) throw new Error("projectMovement requires a start point apart from the target centre");
  const ex = px - tx;
  const ey = py - ty;
  const dx = (ex * ux + ey * uy) / a;
  return { a, dx, distance: a + dx, endError: Math.hypot(ex, ey) };
}
