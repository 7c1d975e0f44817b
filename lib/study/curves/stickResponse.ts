import type { TransferConfig } from "@/lib/motion/config";
import { stickRateMagnitude } from "@/lib/motion/stick/stickRate";

/** Turning rate against the stick's deflection (or the device's tilt), from centre to rim. */
export interface RateResponse {
  kind: "stick" | "tilt";
  /** x: deflection 0–1 (stick) or tilt ° (tilt); rate: view °/s. */
  points: { x: number; rate: number }[];
  deadZone: number;
  outerEdge: number;
}

/**
 * Stick response from centre to rim (stickResponsePoints).
 *
 * Purpose: the picture of the rate stick: the engine's own stage (stickRateMagnitude: radial dead
 * zone, outer edge, exponent, top rate) at each deflection. Source: science.md §8 "Stick".
 * Cost: O(steps).
 * @throws never.
 * @example stickResponsePoints({ ...defaultTransferConfig, stickDeadZone: 0.15, stickOuterEdge: 0.95, stickExponent: 2, stickMaxRateDegPerS: 180 }, 20).points[11] // { x: 0.55, rate: 45 }
 */
export function stickResponsePoints(config: TransferConfig, steps = 100): RateResponse {
  const points = [];
  for (let i = 0; i <= steps; i++) {
    const x = i / steps;
    points.push({ x, rate: stickRateMagnitude(x, config.stickDeadZone, config.stickOuterEdge, config.stickExponent, config.stickMaxRateDegPerS) });
  }
  return { kind: "stick", points, deadZone: config.stickDeadZone, outerEdge: config.stickOuterEdge };
}

/**
 * Tilt-rate response from level to full tilt (tiltResponsePoints): the same stage the engine runs
 * for tilt-rate, with the tilt normalised by the tilt for full rate. Source: science.md §8.
 * Cost: O(steps).
 * @throws never.
 * @example tiltResponsePoints({ ...defaultTransferConfig, tiltDeadZoneDeg: 5, tiltMaxDeg: 30, tiltExponent: 1, tiltMaxRateDegPerS: 120 }, 6).points[3] // { x: 22.5, rate: 84 }
 */
export function tiltResponsePoints(config: TransferConfig, steps = 100): RateResponse {
  const top = Math.min(90, config.tiltMaxDeg * 1.5);
  const points = [];
  for (let i = 0; i <= steps; i++) {
    const x = (top * i) / steps;
    points.push({ x, rate: stickRateMagnitude(x / config.tiltMaxDeg, config.tiltDeadZoneDeg / config.tiltMaxDeg, 1, config.tiltExponent, config.tiltMaxRateDegPerS) });
  }
  return { kind: "tilt", points, deadZone: config.tiltDeadZoneDeg, outerEdge: config.tiltMaxDeg };
}
