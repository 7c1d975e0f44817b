// The stream writer alone: no CSV parser library, so the participant page can import it.
import type { MotionSample } from "./sample";

/** The stream's first eleven columns (interfaces.md "Raw sensor stream"), always written. */
const contractHeader = "t_ms,gyro_x,gyro_y,gyro_z,accel_x,accel_y,accel_z,stick_x,stick_y,buttons,screen_angle";

const cell = (v: number | undefined): string => (v === undefined ? "" : String(v));

/**
 * Write samples in the replay format (formatSampleCsv).
 *
 * Purpose: recorded or simulated streams in the format `npm run replay` reads: the columns of
 * interfaces.md, then each optional group of the project's columns only when a sample has it
 * (pointer movement; pointer position; the selection marker), so a stream without them is written
 * exactly as before. Source: interfaces.md "Raw sensor stream". Cost: O(n).
 * @throws never.
 * @example formatSampleCsv([{ tMs: 0, gyroX: 1, gyroY: 2, gyroZ: 3 }]).split("\n")[1] // "0,1,2,3,,,,,,,0"
 */
export function formatSampleCsv(samples: readonly MotionSample[]): string {
  const withDelta = samples.some((s) => s.pointerDx !== undefined || s.pointerDy !== undefined);
  const withPosition = samples.some((s) => s.pointerX !== undefined || s.pointerY !== undefined);
  const withSelected = samples.some((s) => s.selected !== undefined);
  const lines = [contractHeader + (withDelta ? ",pointer_dx,pointer_dy" : "") + (withPosition ? ",pointer_x,pointer_y" : "") + (withSelected ? ",selected" : "")];
  for (const s of samples) {
    let row = `${s.tMs},${s.gyroX},${s.gyroY},${s.gyroZ},${cell(s.accelX)},${cell(s.accelY)},${cell(s.accelZ)},${cell(s.stickX)},${cell(s.stickY)},${cell(s.buttons)},${s.screenAngleDeg ?? 0}`;
    if (withDelta) row += `,${cell(s.pointerDx)},${cell(s.pointerDy)}`;
    if (withPosition) row += `,${cell(s.pointerX)},${cell(s.pointerY)}`;
    if (withSelected) row += `,${cell(s.selected)}`;
    lines.push(row);
  }
  return lines.join("\n") + "\n";
}
