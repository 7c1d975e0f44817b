import { z } from "zod";

/**
 * One input sample, in the units of the W3C Device Orientation and Motion specification.
 *
 * - `tMs`: time stamp in ms (any origin; must not go backwards within a stream).
 * - `gyroX/Y/Z`: angular rate in deg/s about the device axes x (right in the screen plane),
 *   y (towards the top of the screen), z (out of the screen), natural orientation, right-hand rule
 *   (`rotationRate.alpha/beta/gamma` in the W3C event). Sources without a gyroscope report zeros.
 * - `accelX/Y/Z`: acceleration including gravity, m/s², same axes (all three or none).
 * - `stickX/Y`: thumbstick, −1..1, y down positive (W3C Gamepad standard mapping).
 * - `buttons`: bitmask, bit i = button i held.
 * - `pointerDx/Dy`: pointer (mouse or touch drag) movement since the previous sample, CSS px,
 *   y down positive.
 * - `pointerX/Y`: where a touching finger (or pointer) is, CSS px in the cursor's coordinates
 *   (x right, y down), both or neither; absent while nothing touches. Cursor mode puts the cursor
 *   there (the `touch` technique's absolute positioning); view mode ignores them.
 * - `selected`: 1 on the sample after which the participant selected (the selection point is the
 *   output up to and including this sample), else 0 or absent. The engine ignores it; it lets a
 *   replayed stream be matched with the trial table.
 * - `screenAngleDeg`: `screen.orientation.angle` (how far the device is turned counter-clockwise
 *   from its natural orientation; default 0).
 */
export interface MotionSample {
  tMs: number;
  gyroX: number;
  gyroY: number;
  gyroZ: number;
  accelX?: number | undefined;
  accelY?: number | undefined;
  accelZ?: number | undefined;
  stickX?: number | undefined;
  stickY?: number | undefined;
  buttons?: number | undefined;
  pointerDx?: number | undefined;
  pointerDy?: number | undefined;
  pointerX?: number | undefined;
  pointerY?: number | undefined;
  screenAngleDeg?: number | undefined;
  selected?: number | undefined;
}

const finite = z.number().finite();

/** zod schema of a {@link MotionSample}, for boundaries (JSON, stored streams, sources). */
export const motionSampleSchema = z
  .object({
    tMs: finite,
    gyroX: finite,
    gyroY: finite,
    gyroZ: finite,
    accelX: finite.optional(),
    accelY: finite.optional(),
    accelZ: finite.optional(),
    stickX: finite.min(-1).max(1).optional(),
    stickY: finite.min(-1).max(1).optional(),
    buttons: z.number().int().min(0).max(0xffffffff).optional(),
    pointerDx: finite.optional(),
    pointerDy: finite.optional(),
    pointerX: finite.optional(),
    pointerY: finite.optional(),
    screenAngleDeg: finite.optional(),
    selected: z.union([z.literal(0), z.literal(1)]).optional(),
  })
  .refine(
    (s) =>
      (s.accelX === undefined) === (s.accelY === undefined) &&
      (s.accelY === undefined) === (s.accelZ === undefined),
    { message: "accelX, accelY and accelZ must be given together", path: ["accelX"] },
  )
  .refine((s) => (s.pointerX === undefined) === (s.pointerY === undefined), {
    message: "pointerX and pointerY must be given together",
    path: ["pointerX"],
  });

export { isValidSample } from "./sampleValidity";
