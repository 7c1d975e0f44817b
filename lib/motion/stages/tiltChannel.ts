import { wrapAngleDeg } from "../stick/stickHeading";
import { stickRateMagnitude } from "../stick/stickRate";
import { tiltForwardDeg, tiltSidewaysDeg } from "../stick/tiltAngles";
import type { StageWork } from "./work";

/** The tilt reference: the hold that counts as neutral (taken at the start and at each recenter). */
export interface TiltReferenceState {
  set: boolean;
  sideways: number;
  forward: number;
}

export const createTiltReferenceState = (): TiltReferenceState => ({ set: false, sideways: 0, forward: 0 });

export interface TiltChannelParams {
  deadZoneDeg: number;
  maxDeg: number;
  exponent: number;
  maxRateDegPerS: number;
  /** +1, or −1 with `invertVertical`. */
  verticalSign: number;
}

/**
 * The tilt-rate channel (tiltChannelStep): a held tilt drives a view rate, like a stick.
 *
 * Purpose: the tilt from the reference hold, read from the "up" estimate in the screen frame
 * (`ux..uz`): lowering the right edge turns right; tilting the top edge away from the viewer
 * turns up — the same directions as the motion channel (science.md §8 "Signs"), so the two
 * techniques compare fairly. The tilt's magnitude goes through the radial dead zone and curve of
 * the stick (dead zone, full rate at `maxDeg`). Adds to `viewX/viewY` when `active`; the
 * reference is taken on the first sample after a reset whether active or not. A known poor
 * mapping (Teather & MacKenzie, GI 2014: tilt velocity control 1.2 bits/s), kept for comparison.
 * Source: science.md §8. Cost: O(1).
 * @throws never.
 * @example // right edge lowered 30° at tiltMaxDeg 30, 120 deg/s: +12° of yaw in 0.1 s
 */
export function tiltChannelStep(state: TiltReferenceState, p: TiltChannelParams, work: StageWork, active: boolean): void {
  const sideways = tiltSidewaysDeg(work.ux), forward = tiltForwardDeg(work.uy, work.uz);
  if (!state.set) {
    state.sideways = sideways;
    state.forward = forward;
    state.set = true;
  }
  if (!active) return;
  // Lowering the right edge makes the sideways angle negative: turn right (+x). Tilting the top
  // edge away from the viewer lowers the forward angle: turn up (+y).
  const tx = state.sideways - sideways;
  const ty = wrapAngleDeg(state.forward - forward) * p.verticalSign;
  const mag = Math.sqrt(tx * tx + ty * ty);
  if (mag > 0) {
    const rate = stickRateMagnitude(mag / p.maxDeg, p.deadZoneDeg / p.maxDeg, 1, p.exponent, p.maxRateDegPerS);
    const k = (rate * work.dtS) / mag;
    work.viewX += k * tx;
    work.viewY += k * ty;
  }
}

/** Take a new tilt reference on the next sample (resetTiltReference); part of recenter. Cost: O(1). */
export function resetTiltReference(state: TiltReferenceState): void {
  state.set = false;
}
