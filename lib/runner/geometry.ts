import type { Point } from "@/lib/task/point";
import { ringTargets } from "@/lib/task/ringTargets";
import { ringVisitingOrder } from "@/lib/task/ringVisitingOrder";
import { stripTargets } from "@/lib/task/stripTargets";

/** The targets of one sequence in selection order (n + 1 of them), in task units. */
export interface SequenceLayout {
  type: "ring" | "strip";
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
 * Cost: O(n).
 * @throws Error from ringTargets / stripTargets for an even n or W ≥ A.
 * @example sequenceLayout("ring", 5, 100, 10).order.length // 6
 */
export function sequenceLayout(type: "ring" | "strip", n: number, amplitude: number, width: number): SequenceLayout {
  if (type === "ring") {
    const diameter = amplitude / Math.cos(Math.PI / (2 * n));
    const all = ringTargets(n, diameter);
    return { type, all, order: ringVisitingOrder(n).map((i) => all[i]!), axis: { x: 1, y: 0 }, width, amplitude };
  }
  const [a, b] = stripTargets(amplitude, width);
  const order: Point[] = [];
  for (let k = 0; k <= n; k++) order.push(k % 2 === 0 ? a.centre : b.centre);
  return { type, all: [a.centre, b.centre], order, axis: a.axis, width, amplitude };
}

/**
 * Whether a selection falls inside the target (isInsideTarget).
 *
 * Purpose: the hit column. Ring: within W/2 of the centre (circular target); strip: within W/2
 * of the strip's centre line along the task axis (strips are long across it).
 * Source: ISO 9241-411:2012 task definitions. Cost: O(1).
 * @throws never.
 * @example isInsideTarget("ring", { x: 0, y: 0 }, { x: 0, y: 0 }, { x: 3, y: 4 }, 10) // true
 */
export function isInsideTarget(type: "ring" | "strip", target: Point, axis: Point, p: Point, width: number): boolean {
  if (type === "ring") return Math.hypot(p.x - target.x, p.y - target.y) <= width / 2;
  return Math.abs((p.x - target.x) * axis.x + (p.y - target.y) * axis.y) <= width / 2;
}
