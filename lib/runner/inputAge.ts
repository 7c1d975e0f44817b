import { median, quantile } from "simple-statistics";

/** Input age at drawing, median and 95th percentile (ms); null before anything was drawn. */
export type InputAgeSummary = { medianMs: number; p95Ms: number; n: number } | null;

export interface InputAgeLog {
  /** An input event (its time stamp, ms) reached the engine; it waits for the next drawn frame. */
  arrived(inputMs: number): void;
  /** A frame is drawn now (ms, same clock): every waiting input gets its age. */
  drawn(nowMs: number): void;
  summary(): InputAgeSummary;
  readonly count: number;
}

/**
 * Input age at drawing (createInputAgeLog).
 *
 * Purpose: the delay a participant sees, measured in the page: for every input event that
 * reached the engine, the time from its event time stamp to the start of the animation frame
 * that first drew its effect. Each input waits (its time stamp) until a frame is drawn, then
 * its age is stored (preallocated typed arrays; past `capacity` ages the oldest are
 * overwritten). Median and 95th percentile
 * from simple-statistics. Source: W3C HR-Time (event.timeStamp and performance.now() share the
 * page's clock). Cost: O(1) per input and frame, O(n log n) for the summary.
 * @throws never.
 * @example const log = createInputAgeLog(8); log.arrived(100); log.drawn(110); log.summary()?.medianMs // 10
 */
export function createInputAgeLog(capacity = 16_384, waitingCapacity = 1024): InputAgeLog {
  const ages = new Float64Array(capacity);
  const waiting = new Float64Array(waitingCapacity);
  let n = 0, w = 0;
  return {
    get count() {
      return Math.min(n, capacity);
    },
    arrived(inputMs) {
      if (Number.isFinite(inputMs) && w < waitingCapacity) waiting[w++] = inputMs;
    },
    drawn(nowMs) {
      for (let i = 0; i < w; i++) ages[n++ % capacity] = Math.max(0, nowMs - (waiting[i] as number));
      w = 0;
    },
    summary() {
      const k = Math.min(n, capacity);
      if (k === 0) return null;
      const a = Array.from(ages.subarray(0, k));
      return { medianMs: median(a), p95Ms: quantile(a, 0.95), n: k };
    },
  };
}
