import type { SequenceSummary } from "../analysis/result";

/** One A×W point of a condition's Fitts plot. */
export interface AwMean {
  condition: string;
  amplitude: number;
  width: number;
  /** Mean IDe over the A×W's sequences, bits. */
  ide: number;
  /** Mean MT, ms. */
  mt: number;
  sequences: number;
}

/**
 * A×W means per condition (awMeans): the points the Fitts regression MT = a + b·IDe is fitted
 * over, pooled over participants (interfaces.md "regression"; Soukoreff & MacKenzie 2004 §4).
 * Sequences with a non-finite IDe or MT are skipped.
 * Cost: O(sequences).
 * @throws never.
 * @example awMeans(result.sequences)[0] // { condition: "motion / low", amplitude: 300, width: 30, ide: 3.41, mt: 812.4, sequences: 24 }
 */
export function awMeans(sequences: readonly SequenceSummary[]): AwMean[] {
  const groups = new Map<string, AwMean>();
  for (const s of sequences) {
    if (!Number.isFinite(s.ide) || !Number.isFinite(s.mt)) continue;
    const key = JSON.stringify([s.condition, s.amplitude, s.width]);
    const g = groups.get(key) ?? { condition: s.condition, amplitude: s.amplitude, width: s.width, ide: 0, mt: 0, sequences: 0 };
    g.ide += s.ide;
    g.mt += s.mt;
    g.sequences++;
    groups.set(key, g);
  }
  return [...groups.values()].map((g) => ({ ...g, ide: g.ide / g.sequences, mt: g.mt / g.sequences }));
}
