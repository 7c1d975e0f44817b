import { stickRateMagnitude } from "../stick/stickRate";
import type { StageWork } from "./work";

/** The stick fields of a sample (−1..1, y down; absent = centred). */
export interface StickFields {
  stickX?: number | undefined;
  stickY?: number | undefined;
}

export interface StickRateParams {
  deadZone: number;
  outerEdge: number;
  exponent: number;
  maxRateDegPerS: number;
  /** +1, or −1 with `invertVertical`. */
  verticalSign: number;
}

/**
 * The stick rate channel (stickRateStep): thumbstick deflection drives a view rate.
 *
 * Purpose: radial dead zone r0 and outer edge r1, m' = clamp((|s| − r0)/(r1 − r0), 0, 1),
 * rate = m'^p · max, along the stick's direction; pushing up (negative y in the W3C Gamepad
 * standard mapping, y down) looks up. Adds to `viewX/viewY`. Source: science.md §8 "Stick";
 * W3C Gamepad standard mapping. Cost: O(1).
 * @throws never.
 * @example work.dtS = 0.1; stickRateStep(p, work, { stickX: 0, stickY: -1 }); work.viewY // 18 at 180 deg/s full rate
 */
export function stickRateStep(p: StickRateParams, work: StageWork, sample: StickFields): void {
  const stickX = sample.stickX ?? 0, stickY = sample.stickY ?? 0;
  const r = Math.sqrt(stickX * stickX + stickY * stickY);
  if (r <= p.deadZone) return;
  const k = (stickRateMagnitude(r, p.deadZone, p.outerEdge, p.exponent, p.maxRateDegPerS) * work.dtS) / r;
  work.viewX += k * stickX;
  work.viewY -= k * stickY * p.verticalSign;
}
