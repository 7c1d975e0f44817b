import type { Point } from "../task/point";
import { taskAxis, type Geometry } from "./taskAxis";

/** Path accuracy measures of one movement (units of the table for MV, ME, MO). */
export interface PathAccuracy {
  /** Target re-entries after the first entry. */
  tre: number;
  /** Task-axis crossings. */
  tac: number;
  /** Movement direction changes (perpendicular to the axis). */
  mdc: number;
  /** Orthogonal direction changes (along the axis). */
  odc: number;
  /** Movement variability, sample SD of the perpendicular offsets. */
  mv: number;
  /** Movement error, mean absolute perpendicular offset. */
  me: number;
  /** Movement offset, mean signed perpendicular offset. */
  mo: number;
}

/** The seven measures, in the order they are reported. */
export const PATH_KEYS = ["tre", "tac", "mdc", "odc", "mv", "me", "mo"] as const;

export interface PathAccuracyOptions {
  /** Noise band in the table's unit: a change must exceed it to count. Default 0.05·W. */
  hysteresis?: number;
  /** Points in a plane (default) or view directions on the sphere (degrees of yaw and pitch). */
  geometry?: Geometry;
  /** The target's shape for TRE: a circle of diameter W (ring, default) or a strip W wide across the axis. */
  task?: "ring" | "strip";
}

function countDirectionChanges(values: readonly number[], h: number): number {
  let ref = values[0]!;
  let dir = 0;
  let changes = 0;
  for (let i = 1; i < values.length; i++) {
    const v = values[i]!;
    if (dir === 0) {
      if (v - ref > h) { dir = 1; ref = v; } else if (ref - v > h) { dir = -1; ref = v; }
    } else if (dir === 1) {
      if (v > ref) ref = v;
      else if (ref - v > h) { changes++; dir = -1; ref = v; }
    } else {
      if (v < ref) ref = v;
      else if (v - ref > h) { changes++; dir = 1; ref = v; }
    }
  }
  return changes;
}

/**
 * Path accuracy of one sampled movement (MacKenzie, Kauppinen & Silfverberg, CHI 2001; definitions
 * from memory): the path is moved so the task axis runs from the start target's centre along +x;
 * y is the signed perpendicular distance (on the view sphere: x the angle along the great circle
 * through both targets, y the angle from it; see taskAxis). TRE counts target entries after the
 * first (ring task: the target a circle of diameter W; strip task: a strip W wide across the axis,
 * so only x counts); TAC counts sign changes of y; MDC sign changes of Δy; ODC sign changes of
 * Δx; MV = √(Σ(y − ȳ)²/(n − 1)); ME = Σ|y|/n; MO = ȳ. Every change must exceed the hysteresis band
 * h so sensor noise is not counted (Schmitt-trigger style: a sign must pass ±h, a direction must
 * retreat by more than h from its running extreme; Δ = 0 never counts).
 *
 * Cost: O(samples).
 * @throws Error when fewer than 2 samples, or from and to coincide.
 * @example pathAccuracy([{x: 0, y: 0}, {x: 50, y: 5}, {x: 100, y: 0}], {x: 0, y: 0}, {x: 100, y: 0}, 20) // {tre: 0, tac: 0, mdc: 1, odc: 0, mv: 2.886…, me: 1.666…, mo: 1.666…}
 */
export function pathAccuracy(
  samples: readonly Point[],
  from: Point,
  to: Point,
  width: number,
  options: PathAccuracyOptions = {},
): PathAccuracy {
  if (samples.length < 2) throw new Error("pathAccuracy requires at least 2 samples");
  let axis: ReturnType<typeof taskAxis>;
  try {
    axis = taskAxis(options.geometry ?? "plane", from, to);
  } catch {
    throw new Error("pathAccuracy requires distinct start and target centres");
  }
  const h = options.hysteresis ?? 0.05 * width;
  const xs: number[] = [];
  const ys: number[] = [];
  for (const p of samples) {
    xs.push(axis.along(p));
    ys.push(axis.across(p));
  }
  // Target re-entry with a band: inside at r ≤ W/2, outside again only beyond W/2 + h; r is the
  // distance from the target centre (ring) or along the axis from the strip's centre line (strip).
  const strip = options.task === "strip";
  let inside = false;
  let entries = 0;
  samples.forEach((p, i) => {
    const r = strip ? Math.abs(xs[i]! - axis.length) : axis.between(p, to);
    if (!inside && r <= width / 2) { inside = true; entries++; } else if (inside && r > width / 2 + h) inside = false;
  });
  // Axis crossings: the sign of y must pass from beyond +h to beyond −h or back.
  let side = 0;
  let tac = 0;
  for (const y of ys) {
    if (y > h) { if (side === -1) tac++; side = 1; } else if (y < -h) { if (side === 1) tac++; side = -1; }
  }
  const n = ys.length;
  const mo = ys.reduce((s, y) => s + y, 0) / n;
  const me = ys.reduce((s, y) => s + Math.abs(y), 0) / n;
  const mv = Math.sqrt(ys.reduce((s, y) => s + (y - mo) ** 2, 0) / (n - 1));
  return {
    tre: Math.max(0, entries - 1),
    tac,
    mdc: countDirectionChanges(ys, h),
    odc: countDirectionChanges(xs, h),
    mv,
    me,
    mo,
  };
}
