/** A fixed-capacity FIFO of timed 2-D deltas, for added latency without allocation. */
export interface DelayLine {
  /** Queue a delta stamped `tMs`. When full, the oldest entry is released early (counted). */
  enqueue(tMs: number, dx: number, dy: number): void;
  /** Sum and remove every entry with stamp + delay ≤ nowMs; the sum is left in `out`. */
  release(nowMs: number, delayMs: number, out: { dx: number; dy: number }): void;
  /** Entries released early because the line was full. */
  readonly overflows: number;
  readonly length: number;
  clear(): void;
}

/**
 * Create a delay line (createDelayLine).
 *
 * Purpose: added latency: output at time t is the sum of the deltas produced at or before
 * t − N ms. A ring buffer over preallocated typed arrays; no allocation after creation.
 * Source: standard ring buffer. Cost: O(1) amortised per entry; memory 24 bytes × capacity.
 * @throws Error "createDelayLine requires a capacity of at least 1".
 * @example const d = createDelayLine(8); d.enqueue(0, 1, 2); const o = { dx: 0, dy: 0 }; d.release(50, 50, o); o.dx // 1
 */
export function createDelayLine(capacity: number): DelayLine {
  if (!(capacity >= 1)) throw new Error("createDelayLine requires a capacity of at least 1");
  const cap = Math.floor(capacity);
  const ts = new Float64Array(cap), xs = new Float64Array(cap), ys = new Float64Array(cap);
  let head = 0, count = 0, overflows = 0, spillX = 0, spillY = 0;
  return {
    enqueue(tMs, dx, dy) {
      if (count === cap) {
        spillX += xs[head] as number;
        spillY += ys[head] as number;
        head = (head + 1) % cap;
        count--;
        overflows++;
      }
      const i = (head + count) % cap;
      ts[i] = tMs;
      xs[i] = dx;
      ys[i] = dy;
      count++;
    },
    release(nowMs, delayMs, out) {
      let sx = spillX, sy = spillY;
      spillX = 0;
      spillY = 0;
      while (count > 0 && (ts[head] as number) + delayMs <= nowMs) {
        sx += xs[head] as number;
        sy += ys[head] as number;
        head = (head + 1) % cap;
        count--;
      }
      out.dx = sx;
      out.dy = sy;
    },
    get overflows() {
      return overflows;
    },
    get length() {
      return count;
    },
    clear() {
      head = 0;
      count = 0;
      spillX = 0;
      spillY = 0;
    },
  };
}
