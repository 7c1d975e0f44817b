import type { StageWork } from "./work";

/**
 * The added-latency queue: a ring buffer of timed output steps over preallocated typed arrays
 * (24 bytes per entry), and what was released early because it was full.
 */
export interface LatencyState {
  readonly capacity: number;
  readonly times: Float64Array;
  readonly xs: Float64Array;
  readonly ys: Float64Array;
  head: number;
  count: number;
  overflows: number;
  spillX: number;
  spillY: number;
}

/**
 * An empty added-latency queue (createLatencyState).
 * @throws Error "createLatencyState requires a capacity of at least 1".
 */
export function createLatencyState(capacity: number): LatencyState {
  if (!(capacity >= 1)) throw new Error("createLatencyState requires a capacity of at least 1");
  const cap = Math.floor(capacity);
  return { capacity: cap, times: new Float64Array(cap), xs: new Float64Array(cap), ys: new Float64Array(cap), head: 0, count: 0, overflows: 0, spillX: 0, spillY: 0 };
}

/** Empty the queue (clearLatency); the overflow count stays. Cost: O(1). */
export function clearLatency(state: LatencyState): void {
  state.head = 0;
  state.count = 0;
  state.spillX = 0;
  state.spillY = 0;
}

/**
 * The added-latency stage (latencyStep): hold each output step back by N ms.
 *
 * Purpose: studies add latency to measure its harm; the output at time t is the sum of the steps
 * produced at or before t − N. The step `work.outX/outY` is queued with the sample's time; every
 * queued step that is due is summed into `out.dx/dy`. When the queue is full the oldest step is
 * released early and counted in `overflows`. With N = 0 the step passes unchanged.
 * Source: science.md §8 ("added latency"); a standard ring buffer. Cost: O(1) amortised, no
 * allocation.
 * @throws never.
 * @example latencyStep(q, { delayMs: 50 }, { tMs: 0 }, work, out); // out.dx is 0 until a sample at t ≥ 50
 */
export function latencyStep(state: LatencyState, p: { delayMs: number }, sample: { tMs: number }, work: StageWork, out: { dx: number; dy: number }): void {
  const delayMs = p.delayMs;
  if (delayMs <= 0) {
    out.dx = work.outX;
    out.dy = work.outY;
    return;
  }
  const cap = state.capacity, times = state.times, xs = state.xs, ys = state.ys, now = sample.tMs;
  let head = state.head, count = state.count, sx = state.spillX, sy = state.spillY;
  if (count === cap) {
    sx += xs[head] as number;
    sy += ys[head] as number;
    head = head + 1 === cap ? 0 : head + 1;
    count--;
    state.overflows++;
  }
  let i = head + count;
  if (i >= cap) i -= cap;
  times[i] = now;
  xs[i] = work.outX;
  ys[i] = work.outY;
  count++;
  while (count > 0 && (times[head] as number) + delayMs <= now) {
    sx += xs[head] as number;
    sy += ys[head] as number;
    head = head + 1 === cap ? 0 : head + 1;
    count--;
  }
  out.dx = sx;
  out.dy = sy;
  state.head = head;
  state.count = count;
  state.spillX = 0;
  state.spillY = 0;
}
