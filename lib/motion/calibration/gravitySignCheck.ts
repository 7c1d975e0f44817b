import type { MotionSample } from "../sample";
import { checkAccelGyroAxes, type AccelGyroAxesCheck } from "./accelGyroAxesCheck";
import { checkGravityPosture, type GravityPosture, type GravityPostureCheck } from "./gravityPostureCheck";

/** Result of {@link checkGravitySign}: what the device check does with this device. */
export interface GravitySignCheck {
  /** fine: use as it is; inverted: use with `accelerometerInverted: true` (and record it); cannot-tell: refuse or try again. */
  verdict: "fine" | "inverted" | "cannot-tell";
  /** The value for the configuration's `accelerometerInverted`, or null when it cannot tell. */
  accelerometerInverted: boolean | null;
  /** Whether trying again can help (the participant moved, held it otherwise, or did not tilt); false: refuse. */
  retry: boolean;
  /** A plain sentence for the participant. */
  message: string;
  posture: GravityPostureCheck;
  axes: AccelGyroAxesCheck;
}

/**
 * The device check's gravity-sign test (checkGravitySign).
 *
 * Purpose: decide whether "up" from this device's accelerometer can be trusted, in two steps
 * the participant does: hold the device as the study asks (upright or flat) and keep it still
 * (`held`), then tilt it slowly forward and back and side to side (`tilting`). The held samples
 * say whether "up" points up or down ({@link checkGravityPosture}, W3C: flat screen up reads
 * about +9.8 on z); the tilting samples say whether the accelerometer's axes agree with the
 * gyroscope's ({@link checkAccelGyroAxes}, dĝ/dt = −ω × ĝ). Both fine → fine; inverted → use it
 * with `accelerometerInverted: true` and record that; a mirrored axis → refuse (no retry);
 * anything unclear → try again with the message. Source: W3C Device Orientation and Motion;
 * kinematics of a rotating frame. Cost: O(n).
 * @throws never.
 * @example checkGravitySign({ posture: "upright", held, tilting }).accelerometerInverted // false
 */
export function checkGravitySign(input: { posture: GravityPosture; held: readonly MotionSample[]; tilting: readonly MotionSample[] }): GravitySignCheck {
  const posture = checkGravityPosture(input.held, input.posture);
  const axes = checkAccelGyroAxes(input.tilting);
  const result = (verdict: GravitySignCheck["verdict"], accelerometerInverted: boolean | null, retry: boolean, message: string): GravitySignCheck =>
    ({ verdict, accelerometerInverted, retry, message, posture, axes });
  if (axes.verdict === "mirrored") return result("cannot-tell", null, false, `${axes.message} This study needs it; please take part with another device.`);
  if (posture.verdict === "cannot-tell") return result("cannot-tell", null, true, posture.message);
  if (axes.verdict === "cannot-tell") return result("cannot-tell", null, true, axes.message);
  return posture.verdict === "inverted" ? result("inverted", true, false, posture.message) : result("fine", false, false, posture.message);
}

export { gravityCheckNeeded } from "./gravityCheckNeeded";
