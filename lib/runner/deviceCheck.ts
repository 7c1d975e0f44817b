import type { Technique } from "@/lib/motion/config";

/** What the device check found. */
export interface DeviceInputs {
  motion: boolean;
  gamepad: boolean;
  touch: boolean;
  finePointer: boolean;
  /** Measured motion sample rate (Hz), null when no samples arrived. */
  sampleRateHz: number | null;
}

/** The verdict of a device check: ok, or the message that explains why the study cannot run here. */
export type DeviceVerdict = { ok: true } | { ok: false; message: string };

/**
 * Whether a technique can run on this device (deviceVerdict).
 *
 * Purpose: refuse, with a clear message, before the participant invests time: motion
 * techniques need motion sensors at the study's minimum rate; stick techniques a controller;
 * touch techniques a touch screen; the mouse baseline a fine pointer. Source: W3C Device
 * Orientation and Motion, Gamepad, Pointer Events / Media Queries (pointer: fine).
 * Cost: O(techniques).
 * @throws never.
 * @example deviceVerdict(["motion"], { motion: true, gamepad: false, touch: true, finePointer: false, sampleRateHz: 30 }, 50).ok // false
 */
export function deviceVerdict(techniques: readonly Technique[], inputs: DeviceInputs, minRateHz: number): DeviceVerdict {
  const needMotion = techniques.some((t) => t === "motion" || t === "motion+stick" || t === "motion+touch" || t === "tilt-rate");
  const needStick = techniques.some((t) => t === "stick" || t === "motion+stick");
  const needTouch = techniques.some((t) => t === "touch" || t === "motion+touch");
  const needMouse = techniques.includes("mouse");
  if (needMotion && !inputs.motion) return { ok: false, message: "This study needs a device with motion sensors (a phone, a tablet or a controller with a gyroscope), and this browser reports none. You can open the same link on such a device." };
  if (needMotion && (inputs.sampleRateHz === null || inputs.sampleRateHz < minRateHz)) {
    const got = inputs.sampleRateHz === null ? "no readings" : `${Math.round(inputs.sampleRateHz)} readings per second`;
    return { ok: false, message: `This study needs motion readings at least ${minRateHz} times per second; this device gave ${got}. Closing other apps or using another browser may help.` };
  }
  if (needStick && !inputs.gamepad) return { ok: false, message: "This study needs a game controller. Connect one and press any of its buttons, then check again." };
  if (needTouch && !inputs.touch) return { ok: false, message: "This study needs a touch screen. You can open the same link on a phone or a tablet." };
  if (needMouse && !inputs.finePointer) return { ok: false, message: "This study needs a mouse or a trackpad. You can open the same link on a computer." };
  return { ok: true };
}
