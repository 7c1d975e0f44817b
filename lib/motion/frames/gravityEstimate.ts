/** A mutable 3-vector (reused to keep the engine's hot path free of allocation). */
export interface Vec3 {
  x: number;
  y: number;
  z: number;
}

const DEG = Math.PI / 180;
const STANDARD_GRAVITY = 9.80665;

/**
 * One step of the gravity ("up") estimate by a complementary filter (updateGravityEstimate).
 *
 * Purpose: keep the unit "up" vector in device coordinates from the gyroscope (a world-fixed
 * vector seen from a body turning at ω changes as dĝ/dt = ĝ × ω) and pull it towards the
 * accelerometer's direction with time constant τ (ignored when the accelerometer's magnitude is far
 * from 1 g, i.e. during strong linear acceleration). Source: the standard kinematics of a
 * rotating frame; complementary filtering of gyroscope and accelerometer (common practice).
 * Cost: O(1), no allocation (mutates `up`).
 * @param rate* deg/s, device axes. @param accel* m/s² including gravity, or NaN when absent.
 * @throws never.
 * @example const g = { x: 0, y: 0, z: 1 }; updateGravityEstimate(g, 90, 0, 0, NaN, NaN, NaN, 0.01, 0.5); g.y // 0.0157 (to 4 places)
 */
export function updateGravityEstimate(
  up: Vec3,
  rateX: number,
  rateY: number,
  rateZ: number,
  accelX: number,
  accelY: number,
  accelZ: number,
  dtS: number,
  timeConstantS: number,
): void {
  const wx = rateX * DEG * dtS, wy = rateY * DEG * dtS, wz = rateZ * DEG * dtS;
  let x = up.x + (up.y * wz - up.z * wy);
  let y = up.y + (up.z * wx - up.x * wz);
  let z = up.z + (up.x * wy - up.y * wx);
  if (accelX === accelX && accelY === accelY && accelZ === accelZ) {
    const a = Math.sqrt(accelX * accelX + accelY * accelY + accelZ * accelZ);
    if (a > 0.5 * STANDARD_GRAVITY && a < 1.5 * STANDARD_GRAVITY) {
      const k = timeConstantS <= 0 ? 1 : dtS / (timeConstantS + dtS);
      x += k * (accelX / a - x);
      y += k * (accelY / a - y);
      z += k * (accelZ / a - z);
    }
  }
  const n = Math.sqrt(x * x + y * y + z * z);
  if (n > 1e-9) {
    up.x = x / n;
    up.y = y / n;
    up.z = z / n;
  }
}
