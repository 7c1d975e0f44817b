import { stickHeadingDeg, wrapAngleDeg } from "../stick/stickHeading";
import type { StickFields } from "./stickRateChannel";
import type { StageWork } from "./work";

/** Whether the stick is at its rim, at which heading, and the part of a heading turn still to come. */
export interface HeadingStickState {
  atRim: boolean;
  rimHeading: number;
  pendingTurn: number;
  pendingMs: number;
}

export const createHeadingStickState = (): HeadingStickState => ({ atRim: false, rimHeading: 0, pendingTurn: 0, pendingMs: 0 });

export interface HeadingStickParams {
  /** Deflection (0..1) at which the stick counts as at its rim. */
  rimThreshold: number;
  /** The heading change is spread over this time, ms; 0 = at once. */
  turnTimeMs: number;
}

/**
 * The heading-stick channel (headingStickStep): the stick's direction turns the view.
 *
 * Purpose: when the stick reaches its rim, the view heading changes by the stick's angle
 * atan2(x, −y) from forward (W3C Gamepad standard mapping, y down), spread over `turnTimeMs`;
 * while at the rim, turning the stick turns the view by the same angle (across ±180° without a
 * jump). Horizontal only: the vertical comes from motion. Adds to `viewX`. When not `active`
 * (clutched) it keeps following the stick (so a release does not replay what happened meanwhile),
 * drops the rest of a turn in progress and adds nothing. Source: science.md §8 "Heading stick".
 * Cost: O(1).
 * @throws never.
 * @example // stick pushed right to the rim: the view turns 90° right over turnTimeMs
 */
export function headingStickStep(state: HeadingStickState, p: HeadingStickParams, work: StageWork, sample: StickFields, active: boolean): void {
  const stickX = sample.stickX ?? 0, stickY = sample.stickY ?? 0;
  const r = Math.sqrt(stickX * stickX + stickY * stickY);
  if (r >= p.rimThreshold) {
    const heading = stickHeadingDeg(stickX, stickY);
    if (!state.atRim) {
      state.atRim = true;
      if (active) {
        state.pendingTurn += heading;
        state.pendingMs = p.turnTimeMs;
      }
    } else if (active) {
      work.viewX += wrapAngleDeg(heading - state.rimHeading);
    }
    state.rimHeading = heading;
  } else {
    state.atRim = false;
  }
  if (!active) {
    state.pendingTurn = 0;
    state.pendingMs = 0;
    return;
  }
  if (state.pendingTurn !== 0) {
    const dtMs = work.dtMs;
    if (state.pendingMs <= dtMs) {
      work.viewX += state.pendingTurn;
      state.pendingTurn = 0;
      state.pendingMs = 0;
    } else {
      const part = (state.pendingTurn * dtMs) / state.pendingMs;
      work.viewX += part;
      state.pendingTurn -= part;
      state.pendingMs -= dtMs;
    }
  }
}
