/** A mutable 3-vector (reused to keep the engine's hot path free of allocation). */
export interface Vec3 {
  x: number;
  y: number;
  z: number;
}

const DEG = Math.PI / 180;
const STANDARD_GRAVITY = 9.80665;

/** The accelerometer fields of a sample (m/s², including gravity, device axes; absent = none). */
export interface AccelerationFields {
  accelX?: number | undefined;
  accelY?: number | undefined;
  accelZ?: number | undefined;
}

/** The rates (deg/s, device axes, bias removed) and time step (s) of one sample. */
export interface RotationStep {
  wx: number;
  wy: number;
  wz: number;
  dtS: number;
}

/**
 * One step of the gravity ("up") estimate by a complementary filter (updateGravityEstimate).
 *
 * Purpose: keep the unit "up" vector in device coordinates from the gyroscope (a world-fixed
 * vector seen from a body turning at ω changes as dĝ/dt = −ω × ĝ = ĝ × ω) and pull it towards the
 * accelerometer's direction (times `sign`: −1 for a source found inverted) with time constant τ
 * (ignored when the accelerometer's magnitude is far from 1 g, i.e. during strong linear
 * acceleration, or when the sample has none). Source: the standard kinematics of a rotating frame;
 * complementary filtering of gyroscope and accelerometer (common practice). Cost: O(1), no
 * allocation (mutates `up`; objects only, so nothing is boxed even when not inlined).
 * @throws never.
 * @example const g = { x: 0, y: 0, z: 1 }; updateGravityEstimate(g, { wx: 90, wy: 0, wz: 0, dtS: 0.01 }, {}, { sign: 1, timeConstantS: 0.5 }); g.y // 0.0157 (to 4 places)
 */
export function updateGravityEstimate(up: Vec3, rotation: RotationStep, accel: AccelerationFields, p: { sign: number; timeConstantS: number }): void {
  const k0 = DEG * rotation.dtS;
  const wx = rotation.wx * k0, wy = rotation.wy * k0, wz = rotation.wz * k0;
  let x = up.x + (up.y * wz - up.z * wy);
  let y = up.y + (up.z * wx - up.x * wz);
  let z = up.z + (up.x * wy - up.y * wx);
  const ax = accel.accelX, ay = accel.accelY, az = accel.accelZ;
  if (ax !== undefined && ay !== undefined && az !== undefined) {
    const a = Math.sqrt(ax * ax + ay * ay + az * az);
    if (a > 0.5 * STANDARD_GRAVITY && a < 1.5 * STANDARD_GRAVITY) {
      const tau = p.timeConstantS, dtS = rotation.dtS;
      const k = tau <= 0 ? 1 : dtS / (tau + dtS);
      const toUnit = p.sign / a;
      x += k * (ax * toUnit - x);
      y += k * (ay * toUnit - y);
      z += k * (az * toUnit - z);
    }
  }
  const n = Math.sqrt(x * x + y * y + z * z);
  if (n > 1e-9) {
    up.x = x / n;
    up.y = y / n;
    up.z = z / n;
  }
}
