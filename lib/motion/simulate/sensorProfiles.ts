/** How a simulated sensor reports: rate, noise, bias and coarsening. */
export interface SensorProfile {
  rateHz: number;
  /** SD of white noise added to each gyroscope axis, deg/s. */
  gyroNoiseSdDegPerS: number;
  /** Constant offset of each gyroscope axis, deg/s (what calibration must find). */
  gyroBiasDegPerS: { x: number; y: number; z: number };
  /** SD of white noise on each accelerometer axis, m/s². */
  accelNoiseSdMps2: number;
  /** Rates are rounded to a multiple of this, deg/s (0 = none). */
  quantumDegPerS: number;
  /** SD of time-stamp jitter, ms. */
  jitterSdMs: number;
}

/**
 * Typical sensors (invented but plausible figures of our own): a phone through DeviceMotion
 * (≈ 60 Hz, rates coarsened to 0.1 deg/s, per the W3C specification's privacy note as summarised
 * in science.md §7) and a controller gyroscope read over HID (250 Hz).
 */
export const sensorProfiles = {
  phone: { rateHz: 60, gyroNoiseSdDegPerS: 0.15, gyroBiasDegPerS: { x: 0.3, y: -0.2, z: 0.15 }, accelNoiseSdMps2: 0.05, quantumDegPerS: 0.1, jitterSdMs: 0.8 },
  controller: { rateHz: 250, gyroNoiseSdDegPerS: 0.08, gyroBiasDegPerS: { x: -0.4, y: 0.25, z: 0.1 }, accelNoiseSdMps2: 0.03, quantumDegPerS: 0, jitterSdMs: 0.2 },
} as const satisfies Record<string, SensorProfile>;
