import type { StageWork } from "./work";

/** Time stamp of the previous accepted sample. */
export interface SampleClockState {
  started: boolean;
  lastMs: number;
}

export const createSampleClockState = (): SampleClockState => ({ started: false, lastMs: 0 });

/**
 * The clock stage (sampleClockStep): the time step of a sample.
 *
 * Purpose: Δt from the sample's own time stamp (science.md §7: use `event.timeStamp`, not
 * `interval`), 0 for the first sample, capped at `maxGapMs` so a stalled sensor does not fling
 * the view; written to `work.dtMs` and `work.dtS`. A time stamp before the previous one is
 * refused: returns false and leaves the state as it was (the engine then drops the sample).
 * Cost: O(1).
 * @throws never.
 * @example const c = createSampleClockState(); sampleClockStep(c, { maxGapMs: 100 }, { tMs: 10 }, work); sampleClockStep(c, { maxGapMs: 100 }, { tMs: 5000 }, work); work.dtMs // 100
 */
export function sampleClockStep(state: SampleClockState, p: { maxGapMs: number }, sample: { tMs: number }, work: StageWork): boolean {
  const tMs = sample.tMs;
  let dt = 0;
  if (state.started) {
    if (tMs < state.lastMs) return false;
    dt = tMs - state.lastMs;
    if (dt > p.maxGapMs) dt = p.maxGapMs;
  }
  state.started = true;
  state.lastMs = tMs;
  work.dtMs = dt;
  work.dtS = dt / 1000;
  return true;
}
