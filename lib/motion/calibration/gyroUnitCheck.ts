import type { MotionSample } from "../sample";
import { accelDirections } from "./accelDirections";

/** Verdict of {@link checkGyroUnits}. */
export interface GyroUnitCheck {
  verdict: "deg/s" | "rad/s" | "unknown";
  /**
   * Rotation seen by the gyroscope (read as deg/s) across gravity, divided by the rotation of
   * the accelerometer's gravity direction: ≈ 1 for deg/s, ≈ π/180 ≈ 0.0175 for rad/s.
   */
  ratio: number;
  /** Rotation of the gravity direction over the stream, degrees (the evidence available). */
  tiltTravelDeg: number;
  reason: string;
}

const RAD = 180 / Math.PI;

/**
 * Gyroscope unit sanity check (checkGyroUnits).
 *
 * Purpose: catch a source that reports rad/s where deg/s is expected (e.g. the Generic Sensor
 * `Gyroscope`, which is in rad/s, passed through unconverted). While the device tilts, the
 * gravity direction measured by the accelerometer turns at |ω × ĝ| rad/s; the gyroscope's rate
 * across gravity must agree once converted from deg/s. The ratio of the two travels is ≈ 1 for
 * deg/s and ≈ 1/57.3 for rad/s. Needs ≥ 20° of tilt to judge. Source: W3C Device Orientation
 * and Motion (deg/s) and W3C Gyroscope (rad/s); kinematics of a rotating frame. Cost: O(n).
 * @throws never (returns "unknown" when the stream cannot tell).
 * @example checkGyroUnits(tiltingDeviceSamples).verdict // "deg/s"
 */
export function checkGyroUnits(samples: readonly MotionSample[], smoothingSamples = 5): GyroUnitCheck {
  const { readings: withAccel, directions: dir } = accelDirections(samples, smoothingSamples);
  if (withAccel.length < smoothingSamples * 4) {
    return { verdict: "unknown", ratio: NaN, tiltTravelDeg: 0, reason: "no accelerometer data to compare with" };
  }
  let accelTravel = 0, gyroTravel = 0;
  for (let i = smoothingSamples; i < withAccel.length; i++) {
    const a = dir[i - 1] as [number, number, number], b = dir[i] as [number, number, number];
    const dot = Math.min(1, Math.max(-1, a[0] * b[0] + a[1] * b[1] + a[2] * b[2]));
    accelTravel += Math.acos(dot) * RAD;
    // the averaged direction lags by half the window; compare with the gyroscope over the same step
    const s = withAccel[i - Math.floor(smoothingSamples / 2)] as MotionSample;
    const p = withAccel[i - Math.floor(smoothingSamples / 2) - 1] as MotionSample;
    const dt = (s.tMs - p.tMs) / 1000;
    const cx = s.gyroY * b[2] - s.gyroZ * b[1], cy = s.gyroZ * b[0] - s.gyroX * b[2], cz = s.gyroX * b[1] - s.gyroY * b[0];
    gyroTravel += Math.hypot(cx, cy, cz) * dt;
  }
  if (accelTravel < 20) {
    return { verdict: "unknown", ratio: accelTravel > 0 ? gyroTravel / accelTravel : NaN, tiltTravelDeg: accelTravel, reason: "too little tilt to judge (need 20°)" };
  }
  const ratio = gyroTravel / accelTravel;
  if (ratio > 0.4 && ratio < 2.5) return { verdict: "deg/s", ratio, tiltTravelDeg: accelTravel, reason: "gyroscope agrees with the accelerometer in deg/s" };
  if (ratio > 0.007 && ratio < 0.045) {
    return { verdict: "rad/s", ratio, tiltTravelDeg: accelTravel, reason: "gyroscope is about 57 times too small: it reports rad/s" };
  }
  return { verdict: "unknown", ratio, tiltTravelDeg: accelTravel, reason: "gyroscope and accelerometer disagree" };
}
