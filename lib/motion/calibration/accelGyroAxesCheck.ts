import type { MotionSample } from "../sample";
import { accelDirections } from "./accelDirections";

/** Which accelerometer axis is mirrored relative to the gyroscope's (null: none found). */
export type MirroredAxis = "x" | "y" | "z";

/** Result of {@link checkAccelGyroAxes}. */
export interface AccelGyroAxesCheck {
  verdict: "agree" | "mirrored" | "cannot-tell";
  /**
   * How well the accelerometer's turning "up" follows the gyroscope (cosine similarity of the
   * measured and the predicted change, over the stream): for the axes as they are, and with each
   * accelerometer axis mirrored in turn. ≈ 1 for the right one.
   */
  scores: { asIs: number; x: number; y: number; z: number };
  mirroredAxis: MirroredAxis | null;
  /** Rotation of the gravity direction over the stream, degrees (the evidence available). */
  tiltTravelDeg: number;
  message: string;
}

const RAD = 180 / Math.PI;
const DEG = Math.PI / 180;

/**
 * Do the accelerometer's axes agree with the gyroscope's? (checkAccelGyroAxes)
 *
 * Purpose: a world-fixed vector seen from a turning device changes as dĝ/dt = −ω × ĝ. The
 * direction of accelerationIncludingGravity (gravity, while the hand moves slowly) must turn
 * that way with the gyroscope's ω; an accelerometer axis mirrored against the gyroscope's breaks
 * it (the whole vector negated does not: the equation is linear, and the posture check catches
 * that). Scores the agreement for the axes as they are and with each axis mirrored; needs at
 * least 20° of tilt, about two different axes (a turn about one axis cannot show whether that
 * axis is mirrored). The score is a cosine, so it does not depend on the gyroscope's unit.
 * Source: kinematics of a rotating frame; W3C Device Orientation and Motion (both sensors share
 * the device frame, right-hand rule). Cost: O(n·w) for a smoothing window of w samples.
 * @throws never (says "cannot-tell" when the stream cannot show it).
 * @example checkAccelGyroAxes(tiltingSamples).verdict // "agree"
 */
export function checkAccelGyroAxes(samples: readonly MotionSample[], smoothingSamples = 5): AccelGyroAxesCheck {
  const { readings: withAccel, directions: dir } = accelDirections(samples, smoothingSamples);
  const none = { asIs: NaN, x: NaN, y: NaN, z: NaN };
  if (withAccel.length < smoothingSamples * 4) {
    return { verdict: "cannot-tell", scores: none, mirroredAxis: null, tiltTravelDeg: 0, message: "This device gave no accelerometer readings to compare with its gyroscope." };
  }
  // sums for the cosine similarity of measured and predicted changes, per mirroring; changes are
  // compared over `span` steps, where the turn outweighs the sensor noise
  const signs: [number, number, number][] = [[1, 1, 1], [-1, 1, 1], [1, -1, 1], [1, 1, -1]];
  const dot = [0, 0, 0, 0], mm = [0, 0, 0, 0], pp = [0, 0, 0, 0];
  let travel = 0;
  const lag = Math.floor(smoothingSamples / 2), span = smoothingSamples;
  for (let i = smoothingSamples; i < withAccel.length; i++) {
    const a = dir[i - 1] as [number, number, number], b = dir[i] as [number, number, number];
    travel += Math.acos(Math.min(1, Math.max(-1, a[0] * b[0] + a[1] * b[1] + a[2] * b[2]))) * RAD;
  }
  for (let i = smoothingSamples + span; i < withAccel.length; i++) {
    const a = dir[i - span] as [number, number, number], b = dir[i] as [number, number, number];
    for (let k = 0; k < 4; k++) {
      const [fx, fy, fz] = signs[k] as [number, number, number];
      const dx = fx * (b[0] - a[0]), dy = fy * (b[1] - a[1]), dz = fz * (b[2] - a[2]);
      // predicted change: the sum over the steps of −ω × ĝ · Δt = ĝ × ω · Δt, with the gyroscope
      // read half a window earlier (the averaged direction lags by that much)
      let px = 0, py = 0, pz = 0;
      for (let j = i - span + 1; j <= i; j++) {
        const g = dir[j] as [number, number, number];
        const s = withAccel[j - lag] as MotionSample, p = withAccel[j - lag - 1] as MotionSample;
        const dt = ((s.tMs - p.tMs) / 1000) * DEG;
        const wx = s.gyroX * dt, wy = s.gyroY * dt, wz = s.gyroZ * dt;
        const gx = fx * g[0], gy = fy * g[1], gz = fz * g[2];
        px += gy * wz - gz * wy;
        py += gz * wx - gx * wz;
        pz += gx * wy - gy * wx;
      }
      dot[k] = (dot[k] as number) + dx * px + dy * py + dz * pz;
      mm[k] = (mm[k] as number) + dx * dx + dy * dy + dz * dz;
      pp[k] = (pp[k] as number) + px * px + py * py + pz * pz;
    }
  }
  const score = (k: number): number => ((mm[k] as number) > 0 && (pp[k] as number) > 0 ? (dot[k] as number) / Math.sqrt((mm[k] as number) * (pp[k] as number)) : NaN);
  const scores = { asIs: score(0), x: score(1), y: score(2), z: score(3) };
  const tilt = "tilt the device slowly forward and back, then side to side, a few times";
  if (travel < 20) {
    return { verdict: "cannot-tell", scores, mirroredAxis: null, tiltTravelDeg: travel, message: `Not enough movement to compare the sensors: ${tilt}.` };
  }
  const ranked = (["asIs", "x", "y", "z"] as const).map((k) => [k, scores[k]] as const).sort((p, q) => q[1] - p[1]);
  const [bestKey, best] = ranked[0] as readonly ["asIs" | MirroredAxis, number];
  const second = (ranked[1] as readonly [string, number])[1];
  if (!(best >= 0.8) || best - second < 0.2) {
    return { verdict: "cannot-tell", scores, mirroredAxis: null, tiltTravelDeg: travel, message: `The sensors could not be compared clearly: ${tilt}.` };
  }
  if (bestKey === "asIs") return { verdict: "agree", scores, mirroredAxis: null, tiltTravelDeg: travel, message: "The accelerometer and gyroscope agree." };
  return {
    verdict: "mirrored", scores, mirroredAxis: bestKey, tiltTravelDeg: travel,
    message: `This device's accelerometer has its ${bestKey} axis mirrored against its gyroscope, so it cannot tell which way the device turns about gravity.`,
  };
}
