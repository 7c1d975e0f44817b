import type { PathAccuracy } from "./pathAccuracy";

/**
 * Running totals of one sequence (participant × condition × block × sequence): plain data, so the
 * states of two halves of a file can be merged (mergeSequenceStates) and sent between threads.
 */
export interface SequenceState {
  key: string;
  participant: string;
  condition: string;
  block: number;
  sequence: number;
  amplitude: number;
  width: number;
  factors: Record<string, string>;
  /** First line of the sequence in its file (0 when unknown). */
  firstLine: number;
  /** Rows seen (kept + excluded). */
  rows: number;
  kept: number;
  misses: number;
  excluded: number;
  sumDistance: number;
  sumTimeMs: number;
  /** Welford running mean and sum of squared deviations of dx over the kept movements. */
  dxMean: number;
  dxM2: number;
  pathCount: number;
  pathSums: PathAccuracy;
}

export const PATH_KEYS = ["tre", "tac", "mdc", "odc", "mv", "me", "mo"] as const;

export function emptyPathSums(): PathAccuracy {
  return { tre: 0, tac: 0, mdc: 0, odc: 0, mv: 0, me: 0, mo: 0 };
}

/** Key of one sequence. */
export function sequenceKey(participant: string, condition: string, block: number, sequence: number): string {
  return `${participant}\u0000${condition}\u0000${block}\u0000${sequence}`;
}

/** Key of one movement, for looking up its sampled path. */
export function movementKey(participant: string, condition: string, block: number, sequence: number, trial: number): string {
  return `${sequenceKey(participant, condition, block, sequence)}\u0000${trial}`;
}

/**
 * Merges the running totals of the same sequence seen in two parts of a table (Chan, Golub &
 * LeVeque 1979 pairwise update for the variance). `a` is the earlier part.
 *
 * Cost: O(1).
 * @throws Error when the states belong to different sequences.
 */
export function mergeSequenceStates(a: SequenceState, b: SequenceState): SequenceState {
  if (a.key !== b.key) throw new Error("mergeSequenceStates requires states of the same sequence");
  const n = a.kept + b.kept;
  const delta = b.dxMean - a.dxMean;
  const pathSums = emptyPathSums();
  for (const k of PATH_KEYS) pathSums[k] = a.pathSums[k] + b.pathSums[k];
  return {
    ...a,
    rows: a.rows + b.rows,
    kept: n,
    misses: a.misses + b.misses,
    excluded: a.excluded + b.excluded,
    sumDistance: a.sumDistance + b.sumDistance,
    sumTimeMs: a.sumTimeMs + b.sumTimeMs,
    dxMean: n > 0 ? a.dxMean + (delta * b.kept) / n : 0,
    dxM2: n > 0 ? a.dxM2 + b.dxM2 + (delta * delta * a.kept * b.kept) / n : 0,
    pathCount: a.pathCount + b.pathCount,
    pathSums,
  };
}
