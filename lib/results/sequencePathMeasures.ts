import { pathAccuracy, type PathAccuracy } from "../analysis/pathAccuracy";
import { viewAngleBetween, type Geometry } from "../analysis/taskAxis";
import type { Point } from "../task/point";
import type { ReplayedPositions } from "./replayPositions";

/** One recorded movement of a sequence, as the trial table holds it. */
export interface RecordedMovement {
  trial: number;
  from: Point;
  to: Point;
  start: Point;
  end: Point;
  timeMs: number;
  width: number;
}

/** Path accuracy of a sequence's movements from its replayed stream, or why it could not be computed. */
export type SequencePaths =
  | {
      ok: true;
      /** The movements' path measures, by trial number. */
      measures: Map<number, PathAccuracy>;
      /** The largest distance between a replayed and a recorded selection point (task units or degrees). */
      residual: number;
      /** The stream time of the first selection the alignment found, ms. */
      firstSelectionMs: number;
    }
  | { ok: false; reason: string; residual: number | null };

export interface PathOptions {
  geometry: Geometry;
  task: "ring" | "strip";
  /** Noise band for the direction and crossing counts (default 0.05·W, pathAccuracy's). */
  hysteresis?: number;
  /** Largest replay error accepted, as a fraction of W (default 0.25). */
  tolerance?: number;
}

/** Index of the last sample at or before t (−1 before the first), by binary search. */
function sampleAt(t: Float64Array, time: number): number {
  let lo = -1, hi = t.length - 1;
  while (lo < hi) {
    const mid = (lo + hi + 1) >> 1;
    if (t[mid]! <= time) lo = mid;
    else hi = mid - 1;
  }
  return lo;
}

/**
 * Path accuracy per movement from a replayed stream (sequencePathMeasures).
 *
 * The stream and the movements share no clock reading: the movements hold only their durations.
 * Selection k happens at t₀ + C_k, C_k the sum of the first k movement times (C₀ = 0 for the first
 * selection, which only starts the sequence). t₀ is found as the sample time, among those where the
 * replayed aim lies within W of the first selection point, that minimises the squared distances
 * between the replayed aim at every t₀ + C_k and the recorded selection points; the largest
 * remaining distance is the residual. A residual beyond `tolerance`·W means the stream does not
 * reproduce the recorded selections (a different configuration, a cursor stopped at the screen's
 * edge, a missing calibration): the sequence gets no path measures, with that reason. Otherwise
 * movement k's path is the replayed aim from selection k − 1 to selection k, and pathAccuracy gives
 * TRE, TAC, MDC, ODC, MV, ME and MO (MacKenzie, Kauppinen & Silfverberg 2001; science.md §2), on
 * the view sphere in view mode and with the strip geometry for strip tasks.
 * Cost: O(samples + candidates · movements · log samples).
 * @throws never.
 * @example sequencePathMeasures(replayed, movements, { geometry: "plane", task: "ring" }).ok // true
 */
export function sequencePathMeasures(replayed: ReplayedPositions, movements: readonly RecordedMovement[], options: PathOptions): SequencePaths {
  const ordered = [...movements].sort((a, b) => a.trial - b.trial);
  const { t, x, y } = replayed;
  if (ordered.length === 0) return { ok: false, reason: "no movements recorded for the stream", residual: null };
  if (t.length < 2) return { ok: false, reason: "the stream has fewer than 2 samples", residual: null };
  const width = ordered[0]!.width;
  const distance = options.geometry === "sphere" ? viewAngleBetween : (p: Point, q: Point) => Math.hypot(p.x - q.x, p.y - q.y);
  const offsets = [0];
  for (const m of ordered) offsets.push(offsets.at(-1)! + m.timeMs);
  const recorded = [ordered[0]!.start, ...ordered.map((m) => m.end)];
  // Selections fall on a sample (button) or between samples (tap, time-out): read the aim a hair
  // after the nominal time so a time sum that rounds just below a sample still finds it.
  const EPS_MS = 0.01;
  const aimAt = (time: number): Point => {
    const i = sampleAt(t, time + EPS_MS);
    return i < 0 ? { x: x[0]!, y: y[0]! } : { x: x[i]!, y: y[i]! };
  };
  let best = Number.POSITIVE_INFINITY, bestT0 = Number.NaN;
  for (let i = 0; i < t.length; i++) {
    if (distance({ x: x[i]!, y: y[i]! }, recorded[0]!) > width) continue;
    let cost = 0;
    for (let k = 0; k < recorded.length && cost < best; k++) cost += distance(aimAt(t[i]! + offsets[k]!), recorded[k]!) ** 2;
    if (cost < best) {
      best = cost;
      bestT0 = t[i]!;
    }
  }
  if (!Number.isFinite(bestT0)) return { ok: false, reason: "the replayed aim never comes within W of the first selection point", residual: null };
  const residual = Math.max(...recorded.map((p, k) => distance(aimAt(bestT0 + offsets[k]!), p)));
  const tolerance = (options.tolerance ?? 0.25) * width;
  if (residual > tolerance) {
    return { ok: false, reason: `the replayed stream misses the recorded selection points by up to ${residual.toPrecision(3)} (more than ${(options.tolerance ?? 0.25)}·W)`, residual };
  }
  const measures = new Map<number, PathAccuracy>();
  ordered.forEach((m, k) => {
    const from = bestT0 + offsets[k]!, until = bestT0 + offsets[k + 1]!;
    const first = sampleAt(t, from + EPS_MS);
    const last = sampleAt(t, until + EPS_MS);
    const path: Point[] = [aimAt(from)];
    for (let i = Math.max(0, first + 1); i <= last; i++) path.push({ x: x[i]!, y: y[i]! });
    if (path.length < 2) path.push(aimAt(until));
    try {
      measures.set(m.trial, pathAccuracy(path, m.from, m.to, m.width, { geometry: options.geometry, task: options.task, hysteresis: options.hysteresis }));
    } catch {
      // from = to: no axis (bad data the analysis reports itself)
    }
  });
  return { ok: true, measures, residual, firstSelectionMs: bestT0 };
}
