import type { MotionSample } from "@/lib/motion/sample";

/** The replay format's columns (interfaces.md "Raw sensor stream"), pointer columns last. */
const COLUMNS = "t_ms,gyro_x,gyro_y,gyro_z,accel_x,accel_y,accel_z,stick_x,stick_y,buttons,screen_angle";
const cell = (v: number | undefined): string => (v === undefined ? "" : String(v));

/**
 * A recorded stream as replay CSV (sampleStreamCsv), byte for byte what `formatSampleCsv` in
 * lib/motion/csv.ts writes (tests/unit/streamCsv.test.ts compares the two). A copy because that
 * module also holds the CSV reader, whose parser library brings a Buffer polyfill into the page.
 * Source: interfaces.md "Raw sensor stream". Cost: O(n).
 * @throws never.
 * @example sampleStreamCsv([{ tMs: 0, gyroX: 1, gyroY: 2, gyroZ: 3 }]).split("\n")[1] // "0,1,2,3,,,,,,,0"
 */
export function sampleStreamCsv(samples: readonly MotionSample[]): string {
  const withPointer = samples.some((s) => s.pointerDx !== undefined || s.pointerDy !== undefined);
  const lines = [withPointer ? `${COLUMNS},pointer_dx,pointer_dy` : COLUMNS];
  for (const s of samples) {
    let row = `${s.tMs},${s.gyroX},${s.gyroY},${s.gyroZ},${cell(s.accelX)},${cell(s.accelY)},${cell(s.accelZ)},${cell(s.stickX)},${cell(s.stickY)},${cell(s.buttons)},${s.screenAngleDeg ?? 0}`;
    if (withPointer) row += `,${cell(s.pointerDx)},${cell(s.pointerDy)}`;
    lines.push(row);
  }
  return lines.join("\n") + "\n";
}
