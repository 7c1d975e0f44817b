import type { TransferConfig } from "../config";
import type { GainCurveParams } from "../gain/gainAtSpeed";
import { powerGainFactor } from "../gain/powerGainFactor";
import { twoLevelGainFactor } from "../gain/twoLevelGainFactor";
import type { StageWork } from "./work";

export interface GainStageParams {
  curve: GainCurveParams;
  horizontalMultiplier: number;
  verticalMultiplier: number;
}

/** A gain-curve stage: `rateX/Y` at `speed` → `viewRateX/Y` (Δyaw/Δt = G·gx·h, Δpitch/Δt = G·gy·v). */
export type GainCurveStep = (work: StageWork, p: GainStageParams) => void;

function applyGain(work: StageWork, p: GainStageParams, g: number): void {
  work.viewRateX = g * p.horizontalMultiplier * work.rateX;
  work.viewRateY = g * p.verticalMultiplier * work.rateY;
}

/** Constant CD gain. Source: Casiez & Roussel, UIST 2011 (CD gain). Cost: O(1). */
export function constantGainStep(work: StageWork, p: GainStageParams): void {
  applyGain(work, p, p.curve.gain);
}

/** Two-level gain: a lower gain for slow rotation, blended to full gain ({@link twoLevelGainFactor}). Cost: O(1). */
export function twoLevelGainStep(work: StageWork, p: GainStageParams): void {
  const c = p.curve;
  applyGain(work, p, c.gain * twoLevelGainFactor(work.speed, c.curveSlowSpeedDegPerS, c.curveFastSpeedDegPerS, c.curveSlowGainFactor));
}

/** Power gain: output speed ∝ speed^p ({@link powerGainFactor}). Cost: O(1). */
export function powerGainStep(work: StageWork, p: GainStageParams): void {
  const c = p.curve;
  applyGain(work, p, c.gain * powerGainFactor(work.speed, c.curveReferenceSpeedDegPerS, c.curveExponent));
}

/**
 * The gain-curve stage for a configuration (gainCurveStage).
 *
 * Purpose: CD gain G(s) at the speed after the dead band, times the horizontal and vertical
 * multipliers; the engine picks the curve's stage once, when it is built (the same curves as
 * `gainAtSpeed`). Source: science.md §8; Casiez & Roussel, UIST 2011. Cost: O(1).
 * @throws never.
 * @example work.rateX = 10; work.speed = 10; gainCurveStage("constant")(work, { curve: { ...defaultTransferConfig, gain: 6 }, horizontalMultiplier: 1, verticalMultiplier: 1 }); work.viewRateX // 60
 */
export function gainCurveStage(curve: TransferConfig["gainCurve"]): GainCurveStep {
  return curve === "constant" ? constantGainStep : curve === "two-level" ? twoLevelGainStep : powerGainStep;
}
