import type { TransferConfig } from "../config";
import { adaptiveFrameHorizontal } from "../frames/adaptiveFrame";
import { deviceFrameHorizontal } from "../frames/deviceFrame";
import { gravityFrameHorizontal, gravityFrameVertical } from "../frames/gravityFrame";
import type { StageWork } from "./work";

export interface ReferenceFrameParams {
  axis: TransferConfig["deviceHorizontalAxis"];
  /** +1, or −1 with `invertVertical`. */
  verticalSign: number;
}

/** A reference-frame stage: screen-frame rates (`rx..rz`, `ux..uz`) → `rateX` (right), `rateY` (up). */
export type ReferenceFrameStep = (work: StageWork, p: ReferenceFrameParams) => void;

// Signs (science.md §8 "Signs"): turning the device left (positive about "up") moves left; tilting
// its top edge away (negative about x) moves up; `invertVertical` flips the vertical.

/** Device frame: h from the screen-normal or screen-up axis or both, v = ω_x (science.md §8). Cost: O(1). */
export function deviceFrameStep(work: StageWork, p: ReferenceFrameParams): void {
  work.rateX = -deviceFrameHorizontal(work.ry, work.rz, p.axis);
  work.rateY = -work.rx * p.verticalSign;
}

/** Gravity frame: h = ω·ĝ, v about the horizontalised screen x axis (science.md §8). Cost: O(1). */
export function gravityFrameStep(work: StageWork, p: ReferenceFrameParams): void {
  work.rateX = -gravityFrameHorizontal(work.rx, work.ry, work.rz, work.ux, work.uy, work.uz);
  work.rateY = -gravityFrameVertical(work.rx, work.ry, work.rz, work.ux, work.uy, work.uz) * p.verticalSign;
}

/** Adaptive frame: h from ω_y, ω_z weighted by where gravity points, v = ω_x (science.md §8). Cost: O(1). */
export function adaptiveFrameStep(work: StageWork, p: ReferenceFrameParams): void {
  work.rateX = -adaptiveFrameHorizontal(work.ry, work.rz, work.uy, work.uz);
  work.rateY = -work.rx * p.verticalSign;
}

/**
 * The reference-frame stage for a configuration (referenceFrameStage).
 *
 * Purpose: the engine picks the frame's stage once, when it is built, so each pipeline runs
 * one frame only. Source: science.md §8 "Motion". Cost: O(1).
 * @throws never.
 * @example referenceFrameStage("gravity") === gravityFrameStep // true
 */
export function referenceFrameStage(frame: TransferConfig["frame"]): ReferenceFrameStep {
  return frame === "device" ? deviceFrameStep : frame === "gravity" ? gravityFrameStep : adaptiveFrameStep;
}
