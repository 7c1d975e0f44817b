import { parseTransferConfig, type TransferConfig, type TransferConfigInput } from "./config";
import { createMotionEngineFromValid, type MotionEngine } from "./engineCore";

export { LATENCY_QUEUE_CAPACITY, createMotionEngineFromValid, usesChannel, type MotionEngine, type MotionOutput } from "./engineCore";

/**
 * Create a motion-aim engine (createMotionEngine).
 *
 * Purpose: turns input samples into view or cursor deltas with the configured transfer function,
 * through the named stages of ./stages: clock → controls (clutch, activation, recenter) → bias →
 * gravity reference → screen frame → reference frame (device / gravity / adaptive) → dead band →
 * gain curve with H/V multipliers → fine-aim smoothing; the tilt-rate, stick (rate or heading)
 * and pointer channels by technique; pixels per degree (cursor mode); added latency. Source: science.md §7–8 (W3C axes; Casiez & Roussel 2011 CD gain).
 * Cost: O(1) per sample, no allocation in `push`.
 * @throws TransferConfigError when the configuration fails validation (names field and rule).
 * @example const e = createMotionEngine({ gain: 6 }); e.push({ tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 }); e.push({ tMs: 100, gyroX: 0, gyroY: 30, gyroZ: 0 })?.dx // -18 (a left turn of 3° becomes 18° to the left)
 */
export function createMotionEngine(input: TransferConfigInput | TransferConfig): MotionEngine {
  return createMotionEngineFromValid(parseTransferConfig(input));
}
