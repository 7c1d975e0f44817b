import type { MotionSample } from "../sample";
import { screenFrameY } from "../frames/screenFrame";

/** How the participant is asked to hold the device for the posture check. */
export type GravityPosture = "upright" | "flat";

/** Result of {@link checkGravityPosture}. */
export interface GravityPostureCheck {
  verdict: "fine" | "inverted" | "cannot-tell";
  /**
   * Cosine of the angle between the measured "up" (the mean accelerationIncludingGravity, in the
   * screen's frame) and where "up" must be for the posture: the screen's top edge (upright) or its
   * normal (flat). ≈ +1 for a source that follows the W3C sign, ≈ −1 for an inverted one.
   */
  alignment: number;
  /** Length of the mean reading, m/s² (≈ 9.8 when it reads gravity). */
  magnitudeMps2: number;
  /** Largest angle between one reading and the mean, degrees (hand movement during the hold). */
  spreadDeg: number;
  /** A plain sentence for the participant or the log. */
  message: string;
}

const STANDARD_GRAVITY = 9.80665;
const RAD = 180 / Math.PI;

/**
 * Known-posture check of the accelerometer's sign (checkGravityPosture).
 *
 * Purpose: the gravity and adaptive frames and tilt-rate take "up" from
 * accelerationIncludingGravity, whose sign differs between platforms in the wild; a flipped sign
 * mirrors the horizontal axis without any error. While the participant holds the device as asked,
 * "up" must come out as the screen's top edge (held upright) or its normal (lying flat, screen
 * up) — W3C Device Orientation and Motion: lying flat, screen up, reads about +9.8 m/s² on z.
 * Readings are turned into the screen's frame by `screenAngleDeg` (W3C Screen Orientation), so a
 * phone held upright in landscape counts as upright. Fine when the angle to the expected "up" is
 * under 50°, inverted when it is over 130°; otherwise, or when the readings are not about 1 g or
 * moved by more than 20° during the hold, it cannot tell and says what to do.
 * Source: W3C Device Orientation and Motion (axes, units, sign at rest). Cost: O(n).
 * @throws never.
 * @example checkGravityPosture(samplesHeldUpright, "upright").verdict // "fine"
 */
export function checkGravityPosture(samples: readonly MotionSample[], posture: GravityPosture): GravityPostureCheck {
  const readings = samples.filter((s) => s.accelX !== undefined && s.accelY !== undefined && s.accelZ !== undefined);
  const hold = posture === "upright" ? "upright, screen facing you, top edge up" : "flat on a table, screen up";
  if (readings.length < 5) {
    return { verdict: "cannot-tell", alignment: NaN, magnitudeMps2: NaN, spreadDeg: NaN, message: "This device gave no accelerometer readings, so it cannot tell which way is up." };
  }
  let sx = 0, sy = 0, sz = 0;
  for (const s of readings) {
    sx += s.accelX as number;
    sy += s.accelY as number;
    sz += s.accelZ as number;
  }
  const n = readings.length;
  const mx = sx / n, my = sy / n, mz = sz / n;
  const magnitude = Math.hypot(mx, my, mz);
  let spread = 0;
  for (const s of readings) {
    const a = Math.hypot(s.accelX as number, s.accelY as number, s.accelZ as number);
    const cos = a > 0 && magnitude > 0 ? ((s.accelX as number) * mx + (s.accelY as number) * my + (s.accelZ as number) * mz) / (a * magnitude) : -1;
    spread = Math.max(spread, Math.acos(Math.min(1, Math.max(-1, cos))) * RAD);
  }
  const angle = readings[n - 1]?.screenAngleDeg ?? 0;
  // screen frame: the screen's up is device (sin θ, cos θ); z is unchanged
  const alignment = posture === "upright" ? screenFrameY(mx, my, angle) / magnitude : mz / magnitude;
  const base = { alignment, magnitudeMps2: magnitude, spreadDeg: spread };
  if (!(magnitude > 0.7 * STANDARD_GRAVITY && magnitude < 1.3 * STANDARD_GRAVITY)) {
    return { ...base, verdict: "cannot-tell", message: `The accelerometer read ${magnitude.toFixed(1)} m/s² instead of about 9.8: hold the device still, ${hold}, and try again.` };
  }
  if (spread > 20) {
    return { ...base, verdict: "cannot-tell", message: `The device moved during the check: hold it still, ${hold}, and try again.` };
  }
  const limit = Math.cos((50 * Math.PI) / 180);
  if (alignment >= limit) return { ...base, verdict: "fine", message: "The accelerometer points up as the standard says." };
  if (alignment <= -limit) return { ...base, verdict: "inverted", message: "This device's accelerometer points down instead of up; its readings will be turned round." };
  return { ...base, verdict: "cannot-tell", message: `The device was not held as asked: hold it ${hold}, and try again.` };
}
