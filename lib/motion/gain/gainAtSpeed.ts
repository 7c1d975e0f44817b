import type { TransferConfig } from "../config";
import { powerGainFactor } from "./powerGainFactor";
import { twoLevelGainFactor } from "./twoLevelGainFactor";

/** The configuration fields a gain curve reads. */
export type GainCurveParams = Pick<
  TransferConfig,
  "gain" | "gainCurve" | "curveSlowSpeedDegPerS" | "curveFastSpeedDegPerS" | "curveSlowGainFactor" | "curveExponent" | "curveReferenceSpeedDegPerS"
>;

/**
 * CD gain at a device speed (gainAtSpeed).
 *
 * Purpose: view degrees per device degree for the configured gain curve (constant, two-level,
 * power). Gain 6 turns a 30° device turn into 180° (common practice). Source: CD gain
 * (Casiez & Roussel, UIST 2011). Cost: O(1).
 * @param speed device speed after the dead band, deg/s.
 * @throws never.
 * @example gainAtSpeed({ ...defaultTransferConfig, gain: 6 }, 40) // 6
 */
export function gainAtSpeed(config: GainCurveParams, speed: number): number {
  switch (config.gainCurve) {
    case "constant":
      return config.gain;
    case "two-level":
      return config.gain * twoLevelGainFactor(speed, config.curveSlowSpeedDegPerS, config.curveFastSpeedDegPerS, config.curveSlowGainFactor);
    case "power":
      return config.gain * powerGainFactor(speed, config.curveReferenceSpeedDegPerS, config.curveExponent);
  }
}
