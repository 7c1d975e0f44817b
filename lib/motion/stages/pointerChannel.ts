import type { StageWork } from "./work";

export interface PointerChannelParams {
  cursor: boolean;
  /** Cursor mode: output px per pointer px. View mode: view degrees per pointer px. */
  gain: number;
  /** +1, or −1 with `invertVertical`. */
  verticalSign: number;
}

/** The pointer fields of a sample (CSS px, y down). */
export interface PointerFields {
  pointerDx?: number | undefined;
  pointerDy?: number | undefined;
  pointerX?: number | undefined;
  pointerY?: number | undefined;
}

/** Where the engine's output has got to (output units, before added latency). */
export interface OutputPosition {
  x: number;
  y: number;
}

/**
 * The pointer channel, movement (pointerDeltaStep): mouse or touch-drag deltas.
 *
 * Purpose: cursor mode adds the pointer's movement times `pointerCursorGain` (page y down); view
 * mode turns the view by `pointerDegreesPerPixel` per px, a drag up looking up. `invertVertical`
 * flips the vertical as on every channel. Reads `pointerDx/Dy` (absent = 0); adds to
 * `outX/outY` (output units, after {@link displayUnitsStep}). Source: docs/configuration.md
 * "Pointer"; W3C Pointer Events (CSS px, y down). Cost: O(1).
 * @throws never.
 * @example pointerDeltaStep({ cursor: false, gain: 0.2, verticalSign: 1 }, work, { pointerDx: 10, pointerDy: -5 }); // work.outX += 2, work.outY += 1
 */
export function pointerDeltaStep(p: PointerChannelParams, work: StageWork, sample: PointerFields): void {
  const dx = sample.pointerDx, dy = sample.pointerDy;
  if (dx !== undefined) work.outX += dx * p.gain;
  if (dy !== undefined) work.outY += (p.cursor ? dy : -dy) * p.gain * p.verticalSign;
}

/**
 * The pointer channel, position (pointerPositionStep): the `touch` technique's absolute cursor.
 *
 * Purpose: in cursor mode a touching finger is where the cursor is: when the sample has
 * `pointerX/Y`, this sample's output is set so that the position the engine has reached
 * (before added latency) lands on the finger. Not scaled and not inverted (a position is not a
 * movement); view mode never calls it. Cost: O(1).
 * @throws never.
 * @example pointerPositionStep(work, { x: 100, y: 50 }, { pointerX: 120, pointerY: 40 }); [work.outX, work.outY] // [20, -10]
 */
export function pointerPositionStep(work: StageWork, position: OutputPosition, sample: PointerFields): void {
  const px = sample.pointerX, py = sample.pointerY;
  if (px === undefined || py === undefined) return;
  work.outX = px - position.x;
  work.outY = py - position.y;
}
