import type { TransferConfig } from "@/lib/motion/config";
import { createMotionEngineFromValid } from "@/lib/motion/engineCore";
import type { MotionSample } from "@/lib/motion/sample";
import { minimumJerkFraction } from "@/lib/motion/simulate/minimumJerk";

const G = 9.80665;
const RATE_HZ = 200;
/** Rest after the turn, so smoothing and added latency have released everything (ms). */
const SETTLE_MS = 1500;

/**
 * The samples of a device turned left about the true vertical (deviceTurnSamples): held upright
 * (turning about the screen-up axis, W3C y) or flat (about the screen normal, z), with a
 * minimum-jerk angle profile (Flash & Hogan 1985) over `durationMs`, then at rest. Gyroscope in
 * °/s about the W3C device axes, gravity in the accelerometer (≈ +9.8 along "up").
 * Source: W3C Device Orientation and Motion (axes, units); science.md §9. Cost: O(samples).
 * @throws never.
 * @example deviceTurnSamples(30, 250, "upright").reduce((s, x, i, a) => i ? s + x.gyroY * (x.tMs - a[i - 1].tMs) / 1000 : 0, 0) // ≈ 30
 */
export function deviceTurnSamples(turnDeg: number, durationMs: number, hold: "upright" | "flat"): MotionSample[] {
  const out: MotionSample[] = [];
  const dt = 1000 / RATE_HZ;
  let prev = 0;
  for (let t = 0; t <= durationMs + SETTLE_MS; t += dt) {
    const angle = turnDeg * minimumJerkFraction(Math.min(1, t / durationMs));
    const rate = t === 0 ? 0 : ((angle - prev) * 1000) / dt;
    prev = angle;
    out.push(hold === "upright"
      ? { tMs: t, gyroX: 0, gyroY: rate, gyroZ: 0, accelX: 0, accelY: G, accelZ: 0, screenAngleDeg: 0 }
      : { tMs: t, gyroX: 0, gyroY: 0, gyroZ: rate, accelX: 0, accelY: 0, accelZ: G, screenAngleDeg: 0 });
  }
  return out;
}

/** How far a configuration moves the view or cursor for one device turn. */
export interface TurnDisplacement {
  /** View degrees (view mode) or cursor px (cursor mode), horizontal, positive = the turn's way. */
  displacement: number;
  unit: "view °" | "px";
  hold: "upright" | "flat";
}

/**
 * View or cursor displacement for a device turn (turnDisplacement).
 *
 * Purpose: the third picture: what a 30° turn of the device does at a level's settings, run
 * through the real engine (createMotionEngineFromValid), so gain curves, dead band, smoothing and
 * latency all act as in a session. The hold follows the configuration (flat for the device
 * frame's screen-normal axis, upright otherwise). Techniques without a motion channel give null.
 * Source: the project's engine; CD gain: a gain of 6 turns 30° into 180° (common practice).
 * Cost: O(samples), about (duration + 1.5 s) × 200 samples.
 * @throws never.
 * @example turnDisplacement(parseTransferConfig({ gain: 6 }), 30, 250)?.displacement // 180 (within rounding)
 */
export function turnDisplacement(config: TransferConfig, turnDeg: number, durationMs: number): TurnDisplacement | null {
  if (config.technique !== "motion" && config.technique !== "motion+stick" && config.technique !== "motion+touch") return null;
  const hold = config.frame === "device" && config.deviceHorizontalAxis === "screen-normal" ? "flat" : "upright";
  const engine = createMotionEngineFromValid({ ...config, biasXDegPerS: 0, biasYDegPerS: 0, biasZDegPerS: 0 });
  let x = 0;
  for (const s of deviceTurnSamples(turnDeg, durationMs, hold)) {
    const o = engine.push(s);
    if (o) x += o.dx;
  }
  // A left turn moves left (negative x); report the size in the turn's direction.
  return { displacement: -x, unit: config.displayMode === "cursor" ? "px" : "view °", hold };
}
