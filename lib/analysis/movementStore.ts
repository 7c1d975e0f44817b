/** Flag bits of a stored movement. */
export const FLAG_TIMED_OUT = 1;
export const FLAG_RECENTERED = 2;
export const FLAG_CLUTCHED = 4;
/** The flag bits in the order of FLAG_COLUMNS (timed_out, recentered, clutched). */
export const FLAG_BITS = [FLAG_TIMED_OUT, FLAG_RECENTERED, FLAG_CLUTCHED] as const;

/**
 * The movements of a table in columns of typed arrays (about 50 bytes a movement), so a million
 * rows need no million objects and exclusion rules that need two passes (the MT outlier rule) can
 * run over them. Each movement keeps its sequence index, its projection onto the task axis, its
 * time, hit and flags.
 *
 * Cost: amortised O(1) per push (capacity doubles).
 */
export class MovementStore {
  length = 0;
  seq: Int32Array;
  trial: Int32Array;
  line: Int32Array;
  /** Signed deviation along the axis from the target centre (+ overshoot). */
  dx: Float64Array;
  /** a + dx: the movement's distance along the task axis. */
  distance: Float64Array;
  /** |P − T| (plane) or the great-circle angle from T to P (sphere). */
  endError: Float64Array;
  timeMs: Float64Array;
  hit: Uint8Array;
  flags: Uint8Array;

  constructor(capacity = 1024) {
    this.seq = new Int32Array(capacity);
    this.trial = new Int32Array(capacity);
    this.line = new Int32Array(capacity);
    this.dx = new Float64Array(capacity);
    this.distance = new Float64Array(capacity);
    this.endError = new Float64Array(capacity);
    this.timeMs = new Float64Array(capacity);
    this.hit = new Uint8Array(capacity);
    this.flags = new Uint8Array(capacity);
  }

  private grow(): void {
    const n = this.seq.length * 2;
    const g = <T extends Int32Array | Float64Array | Uint8Array>(a: T): T => {
      const b = new (a.constructor as new (n: number) => T)(n);
      b.set(a);
      return b;
    };
    this.seq = g(this.seq);
    this.trial = g(this.trial);
    this.line = g(this.line);
    this.dx = g(this.dx);
    this.distance = g(this.distance);
    this.endError = g(this.endError);
    this.timeMs = g(this.timeMs);
    this.hit = g(this.hit);
    this.flags = g(this.flags);
  }

  push(seq: number, trial: number, line: number, dx: number, distance: number, endError: number, timeMs: number, hit: boolean, flags: number): void {
    if (this.length === this.seq.length) this.grow();
    const i = this.length++;
    this.seq[i] = seq;
    this.trial[i] = trial;
    this.line[i] = line;
    this.dx[i] = dx;
    this.distance[i] = distance;
    this.endError[i] = endError;
    this.timeMs[i] = timeMs;
    this.hit[i] = hit ? 1 : 0;
    this.flags[i] = flags;
  }

  /** Appends another store's movements, mapping its sequence indices through `seqMap`. */
  append(other: MovementStore, seqMap: Int32Array): void {
    for (let i = 0; i < other.length; i++) {
      this.push(seqMap[other.seq[i]!]!, other.trial[i]!, other.line[i]!, other.dx[i]!, other.distance[i]!, other.endError[i]!, other.timeMs[i]!, other.hit[i] === 1, other.flags[i]!);
    }
  }
}
