import type { MotionSample } from "./sample";

// No schema library here: the participant page imports this through the engine core.
const isFiniteNumber = (v: unknown): boolean => typeof v === "number" && Number.isFinite(v);
const isOptionalFinite = (v: unknown): boolean => v === undefined || isFiniteNumber(v);

/**
 * Sample validity check (allocation-free twin of {@link motionSampleSchema}, for the hot path).
 *
 * Purpose: the engine drops, and counts, any sample for which this is false, before touching its
 * state. Source: the field rules above (W3C units). Cost: O(1), no allocation.
 * @throws never.
 * @example isValidSample({ tMs: 0, gyroX: 1, gyroY: NaN, gyroZ: 0 }) // false
 */
export function isValidSample(s: MotionSample): boolean {
  if (s === null || typeof s !== "object") return false;
  if (!isFiniteNumber(s.tMs) || !isFiniteNumber(s.gyroX) || !isFiniteNumber(s.gyroY) || !isFiniteNumber(s.gyroZ)) {
    return false;
  }
  const ax = s.accelX, ay = s.accelY, az = s.accelZ;
  if (ax === undefined || ay === undefined || az === undefined) {
    if (ax !== undefined || ay !== undefined || az !== undefined) return false;
  } else if (!isFiniteNumber(ax) || !isFiniteNumber(ay) || !isFiniteNumber(az)) {
    return false;
  }
  const sx = s.stickX, sy = s.stickY;
  if (sx !== undefined && (!isFiniteNumber(sx) || sx < -1 || sx > 1)) return false;
  if (sy !== undefined && (!isFiniteNumber(sy) || sy < -1 || sy > 1)) return false;
  const b = s.buttons;
  if (b !== undefined && (!Number.isInteger(b) || b < 0 || b > 0xffffffff)) return false;
  const px = s.pointerX, py = s.pointerY;
  if ((px === undefined) !== (py === undefined) || !isOptionalFinite(px) || !isOptionalFinite(py)) return false;
  const sel = s.selected;
  if (sel !== undefined && sel !== 0 && sel !== 1) return false;
  return isOptionalFinite(s.pointerDx) && isOptionalFinite(s.pointerDy) && isOptionalFinite(s.screenAngleDeg);
}
