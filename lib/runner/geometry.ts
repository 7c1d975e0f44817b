import { viewAngleBetween } from "@/lib/analysis/taskAxis";
import type { Point } from "@/lib/task/point";
import { ringTargets } from "@/lib/task/ringTargets";
import { ringVisitingOrder } from "@/lib/task/ringVisitingOrder";
import { stripTargets } from "@/lib/task/stripTargets";

/**
 * Where a layout lives: "plane" (cursor mode: points in px, mm or visual degrees) or "sphere"
 * (view mode: view directions, x = yaw right, y = pitch up, in degrees).
 */
export type LayoutSurface = "plane" | "sphere";

/** The targets of one sequence in selection order (n + 1 of them), in task units. */
export interface SequenceLayout {
  type: "ring" | "strip";
  surface: LayoutSurface;
  /** Target centres in the order they are selected; the first only starts the clock. */
  order: Point[];
  /** Every target drawn (ring: n circles; strip: the two strips' centres). */
  all: Point[];
  /** Strip task: unit vector of the task axis. */
  axis: Point;
  width: number;
  amplitude: number;
}

/**
 * The layout of one sequence (sequenceLayout).
 *
 * Purpose: where the targets of a multi-directional ring or a one-directional strip pair lie,
 * centred on (0, 0), in the design's unit. The design's amplitude is the nominal A: for the ring
 * that is the chord A = D·cos(π/(2n)), so the ring's diameter is D = A / cos(π/(2n)); the
 * visiting order k·(n+1)/2 mod n makes every hop cross the ring. The strip task alternates
 * between two strips A apart, n movements. Source: ISO 9241-411:2012 Annex B (science.md §1).
 * On the sphere (view mode; science.md §1 "View mode", spherical geometry, our convention) A and W
 * are great-circle angles: the ring's targets lie on a small circle of angular radius ρ about the
 * straight-ahead direction, at the same azimuths as the flat ring, with ρ chosen so that each hop
 * (azimuth π ± π/n) spans A on a great circle: from the spherical law of cosines,
 * sin²ρ = (1 − cos A)/(1 + cos(π/n)) (for small angles ρ → D/2 as in the plane); the strips'
 * centres lie on the horizon at yaw ±A/2 (A apart on that great circle). Targets are returned as
 * (yaw, pitch) in degrees.
 * Cost: O(n).
 * @throws Error from ringTargets / stripTargets for an even n or W ≥ A; for a ring on the sphere
 *   whose A no small circle can give.
 * @example sequenceLayout("ring", 5, 100, 10).order.length // 6
 */
export function sequenceLayout(type: "ring" | "strip", n: number, amplitude: number, width: number, surface: LayoutSurface = "plane"): SequenceLayout {
  if (type === "ring") {
    const diameter = amplitude / Math.cos(Math.PI / (2 * n));
    const flat = ringTargets(n, diameter);
    const all = surface === "plane" ? flat : flat.map((p) => ringDirection(p, diameter / 2, amplitude, n));
    return { type, surface, all, order: ringVisitingOrder(n).map((i) => all[i]!), axis: { x: 1, y: 0 }, width, amplitude };
  }
  const [a, b] = stripTargets(amplitude, width);
  const order: Point[] = [];
  for (let k = 0; k <= n; k++) order.push(k % 2 === 0 ? a.centre : b.centre);
  return { type, surface, all: [a.centre, b.centre], order, axis: a.axis, width, amplitude };
}

const RAD = Math.PI / 180;

/** A flat ring position (radius r) moved onto the small circle of the sphere ring: its (yaw, pitch) in degrees. */
function ringDirection(p: Point, r: number, amplitude: number, n: number): Point {
  const sinRho = Math.sqrt((1 - Math.cos(amplitude * RAD)) / (1 + Math.cos(Math.PI / n)));
  if (!(sinRho <= 1)) throw new Error(`sequenceLayout: no ring on the sphere has hops of ${amplitude}°`);
  const cosRho = Math.sqrt(1 - sinRho * sinRho);
  const x = (sinRho * p.x) / r;
  const y = (sinRho * p.y) / r;
  return { x: Math.atan2(x, cosRho) / RAD, y: Math.asin(Math.max(-1, Math.min(1, y))) / RAD };
}


/**
 * Whether a selection falls inside the target (isInsideTarget).
 *
 * Purpose: the hit column. Ring: within W/2 of the centre (circular target; on the sphere the
 * great-circle angle); strip: within W/2 of the strip's centre line along the task axis (strips
 * are long across it; on the sphere the axis is the horizon, along which the distance is the yaw
 * difference). Source: ISO 9241-411:2012 task definitions; science.md §1 "View mode". Cost: O(1).
 * @throws never.
 * @example isInsideTarget("ring", { x: 0, y: 0 }, { x: 0, y: 0 }, { x: 3, y: 4 }, 10) // true
 */
export function isInsideTarget(type: "ring" | "strip", target: Point, axis: Point, p: Point, width: number, surface: LayoutSurface = "plane"): boolean {
  if (type === "ring") return (surface === "sphere" ? viewAngleBetween(p, target) : Math.hypot(p.x - target.x, p.y - target.y)) <= width / 2;
  return Math.abs((p.x - target.x) * axis.x + (p.y - target.y) * axis.y) <= width / 2;
}
