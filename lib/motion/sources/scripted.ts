import type { MotionSample } from "../sample";
import type { SampleFragment, SampleSource } from "./types";

/**
 * A sample as a fragment (fragmentFromSample).
 *
 * Purpose: feed recorded or simulated samples through the same path as live sources.
 * Source: the project's sample type. Cost: O(1).
 * @throws never.
 * @example fragmentFromSample({ tMs: 1, gyroX: 2, gyroY: 0, gyroZ: 0 }).gyro?.x // 2
 */
export function fragmentFromSample(s: MotionSample): SampleFragment {
  const f: SampleFragment = { tMs: s.tMs, gyro: { x: s.gyroX, y: s.gyroY, z: s.gyroZ } };
  if (s.accelX !== undefined && s.accelY !== undefined && s.accelZ !== undefined) f.accel = { x: s.accelX, y: s.accelY, z: s.accelZ };
  if (s.stickX !== undefined || s.stickY !== undefined) f.stick = { x: s.stickX ?? 0, y: s.stickY ?? 0 };
  if (s.buttons !== undefined) f.buttons = s.buttons;
  if (s.pointerDx !== undefined || s.pointerDy !== undefined) f.pointer = { dx: s.pointerDx ?? 0, dy: s.pointerDy ?? 0 };
  if (s.screenAngleDeg !== undefined) f.screenAngleDeg = s.screenAngleDeg;
  return f;
}

export interface ScriptedSourceOptions {
  /**
   * "immediate": every sample is delivered inside `start` (tests, replay).
   * "real-time": samples are delivered at their recorded pace with the given timer.
   */
  pace?: "immediate" | "real-time";
  setTimer?: (fn: () => void, ms: number) => unknown;
  clearTimer?: (handle: unknown) => void;
}

/**
 * Scripted source (createScriptedSource).
 *
 * Purpose: plays a recorded or simulated stream through the source interface, so the browser
 * task can be driven by the simulated participant. Source: the project's sample type.
 * Cost: O(n) over the run.
 * @throws never.
 * @example const got: SampleFragment[] = []; await createScriptedSource([{ tMs: 0, gyroX: 1, gyroY: 0, gyroZ: 0 }]).start((f) => got.push(f)); got.length // 1
 */
export function createScriptedSource(samples: readonly MotionSample[], options: ScriptedSourceOptions = {}): SampleSource {
  let handle: unknown = null, stopped = false;
  return {
    kind: "scripted",
    async start(sink) {
      stopped = false;
      if ((options.pace ?? "immediate") === "immediate") {
        for (const s of samples) {
          if (stopped) return;
          sink(fragmentFromSample(s));
        }
        return;
      }
      const setTimer = options.setTimer ?? ((fn: () => void, ms: number) => setTimeout(fn, ms));
      let i = 0;
      const next = (): void => {
        if (stopped || i >= samples.length) return;
        const s = samples[i++] as MotionSample;
        sink(fragmentFromSample(s));
        const following = samples[i];
        if (following) handle = setTimer(next, Math.max(0, following.tMs - s.tMs));
      };
      next();
    },
    stop() {
      stopped = true;
      if (handle !== null) (options.clearTimer ?? ((h: unknown) => clearTimeout(h as ReturnType<typeof setTimeout>)))(handle);
      handle = null;
    },
  };
}
