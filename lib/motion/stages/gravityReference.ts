import { updateGravityEstimate, type AccelerationFields, type Vec3 } from "../frames/gravityEstimate";
import type { StageWork } from "./work";

/** The "up" estimate (unit vector, device axes) and whether it has been seeded. */
export interface GravityReferenceState extends Vec3 {
  ready: boolean;
}

export const createGravityReferenceState = (): GravityReferenceState => ({ x: 0, y: 0, z: 1, ready: false });

/** How the accelerometer is read: its sign (−1 for a source found inverted) and the filter's time constant. */
export interface GravityReferenceParams {
  sign: number;
  timeConstantS: number;
}

/**
 * The gravity-reference stage (gravityReferenceStep): keep "up" in device axes.
 *
 * Purpose: the first accelerometer reading seeds "up" (accelerationIncludingGravity points up at
 * rest: W3C Device Orientation and Motion, about +9.8 on z lying flat screen up); after that the
 * gyroscope turns it (dĝ/dt = −ω × ĝ) and the accelerometer pulls it back with the filter's time
 * constant ({@link updateGravityEstimate}). A source whose accelerometer was found inverted by the
 * device check is read with sign −1. Until the first reading, "up" is the screen normal. Uses the
 * rates after bias removal (`work.wx..wz`). Source: science.md §8 "gravity". Cost: O(1).
 * Reads `accelX..Z` (m/s², device axes; absent when the sample has none).
 * @throws never.
 * @example const g = createGravityReferenceState(); gravityReferenceStep(g, { sign: 1, timeConstantS: 0.5 }, work, { accelX: 0, accelY: 9.8, accelZ: 0 }); g.y // 1
 */
export function gravityReferenceStep(state: GravityReferenceState, p: GravityReferenceParams, work: StageWork, sample: AccelerationFields): void {
  const ax = sample.accelX, ay = sample.accelY, az = sample.accelZ;
  if (!state.ready && ax !== undefined && ay !== undefined && az !== undefined) {
    const n = Math.sqrt(ax * ax + ay * ay + az * az);
    if (n > 1e-6) {
      const k = p.sign / n;
      state.x = ax * k;
      state.y = ay * k;
      state.z = az * k;
      state.ready = true;
      return;
    }
  }
  updateGravityEstimate(state, work, sample, p);
}

/**
 * Reset the gravity reference (resetGravityReference): the next accelerometer reading seeds "up"
 * again, as at the start. Part of recenter, which resets orientation references only. Cost: O(1).
 */
export function resetGravityReference(state: GravityReferenceState): void {
  state.ready = false;
}
