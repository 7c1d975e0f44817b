import type { Technique } from "@/lib/motion/config";

/** Where a technique's input comes from in the browser, and what clocks its samples. */
export interface InputPaths {
  /** Gyroscope and accelerometer (Generic Sensor API where present, DeviceMotion otherwise). */
  motion: boolean;
  /** A game controller: its stick is the technique's input ("required"), or only its buttons may help ("optional"). */
  gamepad: "required" | "optional";
  /**
   * The pointer channel: Pointer Lock deltas (mouse), drag deltas on the task area (touch in view
   * mode, motion+touch), the finger's position (touch in cursor mode), or none.
   */
  pointer: "none" | "lock" | "drag" | "direct";
  /** What makes a sample: each gyroscope reading, each controller poll (animation frame), each pointer event. */
  clock: "motion" | "stick" | "pointer";
}

/** Whether a technique reads the motion sensors. */
export const usesMotion = (t: Technique): boolean => t === "motion" || t === "motion+stick" || t === "motion+touch" || t === "tilt-rate";

/**
 * The input paths of a technique in a display mode (inputPathsFor).
 *
 * Purpose: one place that says how each technique reaches the engine in the browser: motion
 * techniques are clocked by the gyroscope (a controller, when connected, adds its buttons; for
 * motion+stick its stick too); the stick alone is clocked by polling the controller once per
 * animation frame, so it needs no gyroscope; mouse through Pointer Lock; touch as the finger's
 * position in cursor mode and as drag deltas in view mode. Source: W3C Generic Sensor and Device
 * Orientation and Motion (sensor events), W3C Gamepad (polling, no events), Pointer Lock 2.0,
 * Pointer Events. Cost: O(1).
 * @throws never.
 * @example inputPathsFor("stick", "view") // { motion: false, gamepad: "required", pointer: "none", clock: "stick" }
 */
export function inputPathsFor(technique: Technique, displayMode: "cursor" | "view"): InputPaths {
  switch (technique) {
    case "motion":
    case "tilt-rate":
      return { motion: true, gamepad: "optional", pointer: "none", clock: "motion" };
    case "motion+stick":
      return { motion: true, gamepad: "required", pointer: "none", clock: "motion" };
    case "motion+touch":
      return { motion: true, gamepad: "optional", pointer: "drag", clock: "motion" };
    case "stick":
      return { motion: false, gamepad: "required", pointer: "none", clock: "stick" };
    case "mouse":
      return { motion: false, gamepad: "optional", pointer: "lock", clock: "pointer" };
    case "touch":
      return { motion: false, gamepad: "optional", pointer: displayMode === "cursor" ? "direct" : "drag", clock: "pointer" };
  }
}
