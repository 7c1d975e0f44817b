import type { MovementColumns } from "@/lib/trials/movementColumns";
import type { Point } from "@/lib/task/point";
import { isInsideTarget, type SequenceLayout } from "./geometry";

/** One movement as the runner records it: the trial table columns that vary per movement. */
export interface RecordedMovement extends MovementColumns {
  trial: number;
  hit: 0 | 1;
  /** 1 when the movement ended by the trial time limit, not by the participant (interfaces.md). */
  timed_out: 0 | 1;
  /** 1 when the participant recentred during the movement. */
  recentered: 0 | 1;
  /** 1 when the clutch was engaged at any moment of the movement. */
  clutched: 0 | 1;
}

/** How a selection came about. */
export interface SelectionCause {
  /** The trial time limit ran out: the selection is forced where the aim is. */
  timedOut?: boolean;
}

/** The state of one running sequence; see {@link createSequenceRecorder}. */
export interface SequenceRecorder {
  /** Index into layout.order of the target to select next. */
  readonly next: number;
  readonly finished: boolean;
  readonly movements: readonly RecordedMovement[];
  /** Time of the previous selection (ms), or null before the first. */
  readonly lastSelectionMs: number | null;
  /**
   * A selection at point p (task units) at time tMs (the input event's time stamp). The first
   * selection only starts the clock. Returns the movement recorded, or null for the first.
   */
  select(tMs: number, p: Point, cause?: SelectionCause): RecordedMovement | null;
  /** When the trial time limit has passed since the previous selection, the time it ran out. */
  timeoutAt(): number | null;
  /** A recenter happened now: flags the running movement (nothing before the first selection). */
  noteRecenter(): void;
  /** The clutch is engaged now: flags the running movement (nothing before the first selection). */
  noteClutch(): void;
}

/**
 * Recorder of one sequence's movements (createSequenceRecorder).
 *
 * Purpose: turn selections into trial table rows: from/to are the previous and current target
 * centres, start is the previous selection point, end the selection point, time the interval
 * between the two selections' time stamps (clamped to the trial time limit: a selection forced
 * at the limit counts as that long), hit from the target's shape (on the view sphere for a
 * layout whose surface is "sphere": great-circle angles, science.md §1), and the movement's flags:
 * `timed_out` when the limit forced the selection, `recentered` / `clutched` when a recenter or
 * an engaged clutch was noted between the two selections (a clutch still held at a selection
 * flags the next movement too, once noted again). Source: interfaces.md "Trial table" (optional
 * columns timed_out, recentered, clutched); ISO 9241-411 (n + 1 selections give n movements).
 * Cost: O(1) per selection.
 * @throws Error "select: the sequence is finished" after the last selection; "select: time went backwards".
 * @example const r = createSequenceRecorder(sequenceLayout("ring", 5, 100, 10), 10000); r.select(0, { x: 0, y: -51 }); r.select(800, { x: 1, y: 2 })?.time_ms // 800
 */
export function createSequenceRecorder(layout: SequenceLayout, timeLimitMs: number): SequenceRecorder {
  const movements: RecordedMovement[] = [];
  let next = 0, lastT: number | null = null, lastP: Point | null = null;
  let recentered: 0 | 1 = 0, clutched: 0 | 1 = 0;
  return {
    get next() {
      return next;
    },
    get finished() {
      return next >= layout.order.length;
    },
    get movements() {
      return movements;
    },
    get lastSelectionMs() {
      return lastT;
    },
    timeoutAt() {
      return lastT === null || next >= layout.order.length ? null : lastT + timeLimitMs;
    },
    noteRecenter() {
      if (lastT !== null && next < layout.order.length) recentered = 1;
    },
    noteClutch() {
      if (lastT !== null && next < layout.order.length) clutched = 1;
    },
    select(tMs, p, cause) {
      if (next >= layout.order.length) throw new Error("select: the sequence is finished");
      if (lastT !== null && tMs < lastT) throw new Error("select: time went backwards");
      const target = layout.order[next]!;
      const point = { x: p.x, y: p.y };
      let row: RecordedMovement | null = null;
      if (lastT !== null && lastP !== null) {
        const from = layout.order[next - 1]!;
        row = {
          trial: next,
          from_x: from.x, from_y: from.y, to_x: target.x, to_y: target.y,
          start_x: lastP.x, start_y: lastP.y, end_x: point.x, end_y: point.y,
          time_ms: Math.min(timeLimitMs, Math.round((tMs - lastT) * 1000) / 1000),
          hit: isInsideTarget(layout.type, target, layout.axis, point, layout.width, layout.surface) ? 1 : 0,
          timed_out: cause?.timedOut ? 1 : 0,
          recentered,
          clutched,
        };
        movements.push(row);
      }
      lastT = tMs;
      lastP = point;
      recentered = 0;
      clutched = 0;
      next++;
      return row;
    },
  };
}
