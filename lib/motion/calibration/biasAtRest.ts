import { mean, sampleStandardDeviation } from "simple-statistics";
import type { MotionSample } from "../sample";

/** Result of {@link estimateBiasAtRest}: bias and residual noise per axis, deg/s. */
export interface BiasEstimate {
  biasXDegPerS: number;
  biasYDegPerS: number;
  biasZDegPerS: number;
  noiseSdXDegPerS: number;
  noiseSdYDegPerS: number;
  noiseSdZDegPerS: number;
  /** The still span used: first and last time stamp, ms, and sample count. */
  fromMs: number;
  toMs: number;
  n: number;
}

export interface BiasAtRestOptions {
  /** Shortest still span accepted, ms (default 1000). */
  minStillMs?: number;
  /** Largest spread (max − min) of any gyroscope axis within a still span, deg/s (default 2). */
  gyroSpreadDegPerS?: number;
  /** Largest spread of any accelerometer axis within a still span, m/s² (default 0.5). */
  accelSpreadMps2?: number;
}

/**
 * Gyroscope bias at rest (estimateBiasAtRest).
 *
 * Purpose: the mean angular rate over the longest span of at least 1 s in which the device is
 * still, judged from the gyroscope and (when present) the accelerometer: every axis stays within a
 * small spread. Reports the residual noise SD (n − 1) of each axis. Bias removal is then
 * `biasXDegPerS` … in the configuration. Source: science.md §8 "Bias" (mean ω over ≥ 1 s at rest).
 * Cost: O(n·w) for n samples and a still span of w samples.
 * @throws Error "estimateBiasAtRest requires at least 1000 ms of still samples (longest still span: 420 ms)".
 * @example estimateBiasAtRest(stillSamples).biasXDegPerS // 0.31 for a device at rest with that offset
 */
export function estimateBiasAtRest(samples: readonly MotionSample[], options: BiasAtRestOptions = {}): BiasEstimate {
  const minStillMs = options.minStillMs ?? 1000;
  const gyroSpread = options.gyroSpreadDegPerS ?? 2;
  const accelSpread = options.accelSpreadMps2 ?? 0.5;
  const valid = samples.filter((s) => Number.isFinite(s.tMs) && Number.isFinite(s.gyroX) && Number.isFinite(s.gyroY) && Number.isFinite(s.gyroZ));
  let bestFrom = 0, bestTo = -1, bestSpan = -1;
  let i = 0;
  while (i < valid.length) {
    const lo = [Infinity, Infinity, Infinity, Infinity, Infinity, Infinity];
    const hi = [-Infinity, -Infinity, -Infinity, -Infinity, -Infinity, -Infinity];
    let j = i;
    for (; j < valid.length; j++) {
      const s = valid[j] as MotionSample;
      const v = [s.gyroX, s.gyroY, s.gyroZ, s.accelX ?? NaN, s.accelY ?? NaN, s.accelZ ?? NaN];
      let ok = true;
      for (let k = 0; k < 6; k++) {
        const x = v[k] as number;
        if (Number.isNaN(x)) continue;
        const nlo = Math.min(lo[k] as number, x), nhi = Math.max(hi[k] as number, x);
        if (nhi - nlo > (k < 3 ? gyroSpread : accelSpread)) ok = false;
      }
      if (!ok) break;
      for (let k = 0; k < 6; k++) {
        const x = v[k] as number;
        if (Number.isNaN(x)) continue;
        lo[k] = Math.min(lo[k] as number, x);
        hi[k] = Math.max(hi[k] as number, x);
      }
    }
    const span = j - 1 >= i ? (valid[j - 1] as MotionSample).tMs - (valid[i] as MotionSample).tMs : 0;
    if (span > bestSpan) {
      bestSpan = span;
      bestFrom = i;
      bestTo = j - 1;
    }
    if (j >= valid.length) break;
    i++;
  }
  if (bestSpan < minStillMs || bestTo - bestFrom < 1) {
    throw new Error(`estimateBiasAtRest requires at least ${minStillMs} ms of still samples (longest still span: ${Math.max(0, Math.round(bestSpan))} ms)`);
  }
  const still = valid.slice(bestFrom, bestTo + 1);
  const xs = still.map((s) => s.gyroX), ys = still.map((s) => s.gyroY), zs = still.map((s) => s.gyroZ);
  return {
    biasXDegPerS: mean(xs),
    biasYDegPerS: mean(ys),
    biasZDegPerS: mean(zs),
    noiseSdXDegPerS: sampleStandardDeviation(xs),
    noiseSdYDegPerS: sampleStandardDeviation(ys),
    noiseSdZDegPerS: sampleStandardDeviation(zs),
    fromMs: (still[0] as MotionSample).tMs,
    toMs: (still[still.length - 1] as MotionSample).tMs,
    n: still.length,
  };
}
