import type { MotionSample } from "../sample";

/**
 * The samples that carry accelerometer readings, and the direction of each reading averaged over
 * the last `window` of them (accelDirections).
 *
 * Purpose: the sensor checks compare how gravity's direction turns with what the gyroscope says;
 * a moving average takes out sensor noise and hand tremor (it lags by half the window, which the
 * callers allow for). Directions are unit vectors in device axes. Source: moving average (standard).
 * Cost: O(n).
 * @throws never.
 * @example accelDirections(samples, 5).directions[0] // [0, 1, 0] for a device held upright
 */
export function accelDirections(samples: readonly MotionSample[], window: number): { readings: MotionSample[]; directions: [number, number, number][] } {
  const readings = samples.filter((s) => s.accelX !== undefined && s.accelY !== undefined && s.accelZ !== undefined);
  const directions: [number, number, number][] = [];
  let sx = 0, sy = 0, sz = 0;
  for (let i = 0; i < readings.length; i++) {
    const s = readings[i] as MotionSample;
    sx += s.accelX as number;
    sy += s.accelY as number;
    sz += s.accelZ as number;
    if (i >= window) {
      const o = readings[i - window] as MotionSample;
      sx -= o.accelX as number;
      sy -= o.accelY as number;
      sz -= o.accelZ as number;
    }
    const n = Math.hypot(sx, sy, sz) || 1;
    directions.push([sx / n, sy / n, sz / n]);
  }
  return { readings, directions };
}
