import type { MotionEngine, MotionOutput } from "./engineCore";

/** Where the output is shown: cursor mode CSS px (x right, y down), view mode yaw/pitch degrees. */
export interface ShownPosition {
  x: number;
  y: number;
}

/** The task area a cursor is kept in: x in [0, width], y in [0, height], CSS px. */
export interface CursorBounds {
  width: number;
  height: number;
}

/**
 * Add one engine step to the shown position, keeping a cursor inside its task area (moveShownPosition).
 *
 * Purpose: the one rule for what a participant sees, so the runner and the replay CLI
 * (`--bounds W,H`) cannot drift apart: the shown position is the sum of the engine's steps,
 * except that a cursor stops at the task area's edges (as a mouse pointer stops at the screen's)
 * instead of leaving the area. When the edge stops it, the engine is told where the cursor now is
 * (`setPosition`), so a later absolute touch position is reached from there. Pass `bounds: null`
 * for view mode (yaw and pitch are not bounded) or for an unbounded cursor. Source: none beyond
 * this project's convention (stated in docs/configuration.md "Raw stream and replay").
 * Cost: O(1), no allocation.
 * @throws never.
 * @example const p = { x: 10, y: 10 }; moveShownPosition(p, { dx: -30, dy: 10 }, { width: 500, height: 300 }, engine); p // { x: 0, y: 20 }
 */
export function moveShownPosition(shown: ShownPosition, step: Readonly<Pick<MotionOutput, "dx" | "dy">>, bounds: Readonly<CursorBounds> | null, engine: Pick<MotionEngine, "setPosition">): void {
  shown.x += step.dx;
  shown.y += step.dy;
  if (bounds === null) return;
  const x = Math.min(Math.max(shown.x, 0), bounds.width);
  const y = Math.min(Math.max(shown.y, 0), bounds.height);
  if (x !== shown.x || y !== shown.y) {
    shown.x = x;
    shown.y = y;
    engine.setPosition(x, y);
  }
}
