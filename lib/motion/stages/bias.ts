import type { StageWork } from "./work";

/** Gyroscope bias per device axis, deg/s (from calibration at rest). */
export interface BiasParams {
  x: number;
  y: number;
  z: number;
}

/**
 * The bias stage (biasStep): subtract the gyroscope's rest offset.
 *
 * Purpose: a gyroscope reads a small constant rate at rest; left in, it drifts the view.
 * The offset is measured at rest (`estimateBiasAtRest`) and subtracted from every sample,
 * device axes, before anything else. Source: science.md §8 "Bias". Cost: O(1).
 * @throws never.
 * @example biasStep(work, { x: 0.3, y: 0, z: 0 }, { gyroX: 1.3, gyroY: 0, gyroZ: 0 }); work.wx // 1
 */
export function biasStep(work: StageWork, bias: BiasParams, sample: { gyroX: number; gyroY: number; gyroZ: number }): void {
  work.wx = sample.gyroX - bias.x;
  work.wy = sample.gyroY - bias.y;
  work.wz = sample.gyroZ - bias.z;
}
