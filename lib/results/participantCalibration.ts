import type { TransferConfig } from "../motion/config";
import { pixelsPerTaskUnit } from "../runner/calibration";
import type { StudyDesign } from "../study/design";
import type { ReplaySetup } from "./replayPositions";

/** What a participant's calibration adds to a replay: the sensor bias and the screen's scale. */
export interface ParticipantCalibration {
  bias: Partial<Pick<TransferConfig, "biasXDegPerS" | "biasYDegPerS" | "biasZDegPerS">>;
  /** Card method (Li et al. 2020): CSS px per mm; null when not measured. */
  pixelsPerMm: number | null;
  /** Blind-spot method: viewing distance, mm; null when not measured. */
  viewingDistanceMm: number | null;
}

export const NO_CALIBRATION: ParticipantCalibration = { bias: {}, pixelsPerMm: null, viewingDistanceMm: null };

/**
 * How a sequence's stream maps onto its task for a participant (replaySetupFor): the study's
 * display mode and, in cursor mode, the CSS pixels per task unit the runner drew with
 * (pixelsPerTaskUnit: 1 for px, the card's px/mm for mm, the visual-angle scale for visual degrees).
 * Cost: O(1).
 * @throws never; returns the reason when the calibration the unit needs was not recorded.
 * @example replaySetupFor(design.task, 300, NO_CALIBRATION) // { displayMode: "cursor", pixelsPerUnit: 1 } for a px study
 */
export function replaySetupFor(task: Pick<StudyDesign["task"], "displayMode" | "unit">, amplitude: number, cal: ParticipantCalibration): ReplaySetup | { reason: string } {
  const displayMode = task.displayMode;
  if (displayMode === "view") return { displayMode, pixelsPerUnit: 1 };
  try {
    return { displayMode, pixelsPerUnit: pixelsPerTaskUnit(task.unit, amplitude, cal) };
  } catch (e) {
    return { reason: (e as Error).message.replace(/^pixelsPerTaskUnit: /, "") };
  }
}
