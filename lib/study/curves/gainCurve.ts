import type { TransferConfig } from "@/lib/motion/config";
import { speedAfterDeadBand } from "@/lib/motion/gain/deadBand";
import { gainAtSpeed } from "@/lib/motion/gain/gainAtSpeed";

/** One point of the speed map: device speed in, output speed out. */
export interface SpeedPoint {
  /** Device speed, °/s. */
  device: number;
  /** Output speed: view °/s (view mode) or cursor px/s (cursor mode). */
  output: number;
}

/** The speed map of a configuration with its marked ranges, all in device °/s. */
export interface GainCurve {
  unit: "view °/s" | "px/s";
  points: SpeedPoint[];
  /** Rotation slower than this is dropped (0: no dead band). */
  deadBand: number;
  /** Fine-aim smoothing acts below this device speed (null: smoothing off). */
  smoothingBelow: number | null;
  /** Two-level curve: the slow and fast speeds (device °/s); null for other curves. */
  slowSpeed: number | null;
  fastSpeed: number | null;
}

/**
 * Output speed against device speed for the motion channel (gainCurvePoints).
 *
 * Purpose: the picture of what the gain, its curve and the dead band do, computed with the
 * engine's own stages (speedAfterDeadBand, then gainAtSpeed on the reduced speed, as
 * lib/motion/engineCore.ts runs them); fine-aim smoothing is marked where it acts (the engine
 * weighs it by the reduced speed). Cursor mode multiplies by pixels per degree. Source:
 * science.md §8 (CD gain, Casiez & Roussel 2011). Cost: O(steps).
 * @throws never.
 * @example gainCurvePoints({ ...defaultTransferConfig, gain: 6 }, 60, 2).points // [{device:0,output:0},{device:30,output:180},{device:60,output:360}]
 */
export function gainCurvePoints(config: TransferConfig, maxDeviceSpeed: number, steps = 120): GainCurve {
  const scale = config.displayMode === "cursor" ? config.pixelsPerDegree : 1;
  const points: SpeedPoint[] = [];
  for (let i = 0; i <= steps; i++) {
    const device = (maxDeviceSpeed * i) / steps;
    const reduced = speedAfterDeadBand(device, config.deadBandDegPerS);
    points.push({ device, output: gainAtSpeed(config, reduced) * reduced * scale });
  }
  const two = config.gainCurve === "two-level";
  return {
    unit: config.displayMode === "cursor" ? "px/s" : "view °/s",
    points,
    deadBand: config.deadBandDegPerS,
    smoothingBelow: config.smoothingTimeMs > 0 ? config.deadBandDegPerS + config.smoothingSpeedDegPerS : null,
    slowSpeed: two ? config.deadBandDegPerS + config.curveSlowSpeedDegPerS : null,
    fastSpeed: two ? config.deadBandDegPerS + config.curveFastSpeedDegPerS : null,
  };
}
