import type { Vec3 } from "../frames/gravityEstimate";
import { screenFrameX, screenFrameY } from "../frames/screenFrame";
import type { StageWork } from "./work";

/** The screen angle last seen and its cosine and sine (recomputed only when it changes). */
export interface ScreenRotationState {
  angle: number;
  cos: number;
  sin: number;
}

export const createScreenRotationState = (): ScreenRotationState => ({ angle: 0, cos: 1, sin: 0 });

/**
 * The screen-frame stage (screenRotationStep): device axes → the screen's current axes.
 *
 * Purpose: DeviceMotion axes are fixed to the device's natural orientation; with the screen
 * turned by `screen.orientation.angle` θ (counter-clockwise), the screen's right is device
 * (cos θ, −sin θ) and its up (sin θ, cos θ). Turns the bias-free rates (`wx..wz` → `rx..rz`) and
 * the "up" estimate (→ `ux..uz`) with the same rotation as {@link screenFrameX}/{@link screenFrameY},
 * caching the cosine and sine. Source: W3C Device Orientation and Motion; W3C Screen Orientation.
 * Cost: O(1); trigonometry only when the angle changes.
 * @throws never.
 * @example screenRotationStep(s, { screenAngleDeg: 90 }, work, up); // work.ry = work.wx (the device's right edge is on top)
 */
export function screenRotationStep(state: ScreenRotationState, sample: { screenAngleDeg?: number | undefined }, work: StageWork, up: Vec3): void {
  const angleDeg = sample.screenAngleDeg ?? 0;
  if (angleDeg !== state.angle) {
    state.angle = angleDeg;
    state.cos = screenFrameX(1, 0, angleDeg);
    state.sin = screenFrameY(1, 0, angleDeg);
  }
  const c = state.cos, s = state.sin;
  const wx = work.wx, wy = work.wy;
  work.rx = wx * c - wy * s;
  work.ry = wx * s + wy * c;
  work.rz = work.wz;
  work.ux = up.x * c - up.y * s;
  work.uy = up.x * s + up.y * c;
  work.uz = up.z;
}
