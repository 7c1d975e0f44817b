import { exponentialSmoothingFactor, fineAimDirectWeight } from "../gain/fineAimSmoothing";
import type { StageWork } from "./work";

/** The smoother's state: the smoothed slow share of the view rate, deg/s. */
export interface FineAimSmoothingState {
  x: number;
  y: number;
}

export const createFineAimSmoothingState = (): FineAimSmoothingState => ({ x: 0, y: 0 });

export interface FineAimSmoothingParams {
  /** Time constant τ of the first-order low-pass, ms; 0 = off. */
  timeMs: number;
  /** Device speed at and above which the input passes unsmoothed, deg/s. */
  speedDegPerS: number;
}

/**
 * The fine-aim smoothing stage (fineAimSmoothingStep): smooth the slow share of the rate only.
 *
 * Purpose: split the view rate x into a direct share w(s)·x and a slow share (1 − w(s))·x; the
 * smoother's state follows the slow share only (never the full rate), and the output is
 * direct + smoothed. With α = Δt/(τ + Δt) the smoothed share sums to the slow share's sum minus
 * τ times what is still in the smoother, so a movement from rest to rest travels the same total
 * angle as unsmoothed: smoothing delays the slow part, it never adds movement after the hand stops.
 * Reads `speed`, `viewRateX/Y`; writes `viewRateX/Y`. Source: science.md §8 "Fine-aim
 * smoothing"; discretised first-order RC filter. Cost: O(1).
 * @throws never.
 * @example const s = createFineAimSmoothingState(); work.speed = 0; work.viewRateX = 10; fineAimSmoothingStep(s, { timeMs: 30, speedDegPerS: 10 }, work); work.viewRateX // 2.5 when work.dtMs = 10
 */
export function fineAimSmoothingStep(state: FineAimSmoothingState, p: FineAimSmoothingParams, work: StageWork): void {
  if (p.timeMs <= 0) return;
  const w = fineAimDirectWeight(work.speed, p.speedDegPerS);
  const a = exponentialSmoothingFactor(work.dtMs, p.timeMs);
  const x = work.viewRateX, y = work.viewRateY;
  state.x += a * ((1 - w) * x - state.x);
  state.y += a * ((1 - w) * y - state.y);
  work.viewRateX = w * x + state.x;
  work.viewRateY = w * y + state.y;
}

/** Empty the smoother (clearFineAimSmoothing): what it held is not delivered. Cost: O(1). */
export function clearFineAimSmoothing(state: FineAimSmoothingState): void {
  state.x = 0;
  state.y = 0;
}
