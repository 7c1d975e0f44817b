import type { MotionSample } from "../sample";
import type { SampleFragment } from "./types";

/** Which fragments make a sample: gyroscope readings, controller polls, pointer movements, or every fragment. */
export type MixerClock = "motion" | "stick" | "pointer" | "any";

export interface SampleMixer {
  /** Take a fragment; returns a complete sample when this fragment is a clock tick, else null. */
  accept(fragment: SampleFragment): MotionSample | null;
  /**
   * Time stamp of the newest input event that went into the last sample returned (NaN when that
   * sample carried no new input), for the input age at drawing.
   */
  readonly lastInputMs: number;
}

/**
 * Join fragments from several sources into samples (createSampleMixer).
 *
 * Purpose: the engine wants one sample per step; sources deliver parts at their own rates. The
 * mixer keeps the latest stick, acceleration and screen angle, the controller's buttons and the
 * on-screen controls (a sample's `buttons` is their union, with any pulse added once), sums
 * pointer deltas since the last sample, gives the latest finger position (absolute touch) to
 * the next sample only, and emits a sample on each clock tick: a gyroscope
 * fragment (clock "motion"), a controller poll (clock "stick": the Gamepad API has no events, so
 * the poll is the clock), a pointer movement (clock "pointer") or any fragment (clock "any").
 * Sources without a gyroscope report zero rates. Sample times never go backwards (a fragment
 * stamped before the previous sample takes that sample's time). Source: the project's sample
 * type; W3C Gamepad ("timestamp", polling). Cost: O(1) per fragment.
 * @throws never.
 * @example createSampleMixer("motion").accept({ tMs: 5, gyro: { x: 1, y: 0, z: 0 } })?.gyroX // 1
 */
export function createSampleMixer(clock: MixerClock): SampleMixer {
  let stickX: number | undefined, stickY: number | undefined;
  let pad: number | undefined, controls: number | undefined, pulse = 0;
  let accel: { x: number; y: number; z: number } | undefined;
  let screenAngleDeg: number | undefined;
  let pdx = 0, pdy = 0, havePointer = false;
  let position: { x: number; y: number } | undefined;
  let lastT = -Infinity, newestInput = NaN, lastInputMs = NaN;
  const ticks = (f: SampleFragment): boolean =>
    clock === "any" || (clock === "motion" ? f.gyro !== undefined : clock === "stick" ? f.stick !== undefined : f.pointer !== undefined || f.position !== undefined);
  return {
    get lastInputMs() {
      return lastInputMs;
    },
    accept(f) {
      if (f.stick) {
        stickX = f.stick.x;
        stickY = f.stick.y;
      }
      if (f.buttons !== undefined) pad = f.buttons;
      if (f.controls !== undefined) controls = f.controls;
      if (f.pulse) pulse |= f.pulse;
      if (f.accel) accel = f.accel;
      if (f.screenAngleDeg !== undefined) screenAngleDeg = f.screenAngleDeg;
      if (f.pointer) {
        pdx += f.pointer.dx;
        pdy += f.pointer.dy;
        havePointer = true;
      }
      if (f.position) position = f.position;
      if (f.inputMs !== undefined && !(f.inputMs <= newestInput)) newestInput = f.inputMs;
      if (!ticks(f)) return null;
      const held = pad === undefined && controls === undefined && pulse === 0 ? undefined : ((pad ?? 0) | (controls ?? 0) | pulse) >>> 0;
      const tMs = f.tMs < lastT ? lastT : f.tMs;
      const s: MotionSample = {
        tMs,
        gyroX: f.gyro?.x ?? 0,
        gyroY: f.gyro?.y ?? 0,
        gyroZ: f.gyro?.z ?? 0,
        accelX: accel?.x,
        accelY: accel?.y,
        accelZ: accel?.z,
        stickX,
        stickY,
        buttons: held,
        pointerDx: havePointer ? pdx : undefined,
        pointerDy: havePointer ? pdy : undefined,
        pointerX: position?.x,
        pointerY: position?.y,
        screenAngleDeg,
      };
      position = undefined;
      lastT = tMs;
      lastInputMs = newestInput;
      newestInput = NaN;
      pulse = 0;
      pdx = 0;
      pdy = 0;
      havePointer = false;
      return s;
    },
  };
}
