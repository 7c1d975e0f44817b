import type { SequenceSummary } from "../analysis/result";

export interface LearningPoint {
  condition: string;
  block: number;
  /** Mean over participants of each participant's mean TP in that block, bits/s. */
  tp: number;
  participants: number;
}

/**
 * Throughput by block per condition (learningCurve), as a mean of means: a participant's
 * sequences in one block are averaged first, then participants (Soukoreff & MacKenzie 2004 §4:
 * never pool raw movements across people).
 * Cost: O(sequences).
 * @throws never.
 * @example learningCurve(result.sequences) // [{ condition: "motion / low", block: 1, tp: 3.02, participants: 12 }, …]
 */
export function learningCurve(sequences: readonly SequenceSummary[]): LearningPoint[] {
  const perPerson = new Map<string, { condition: string; block: number; sum: number; n: number }>();
  for (const s of sequences) {
    if (!Number.isFinite(s.tp)) continue;
    const key = JSON.stringify([s.condition, s.block, s.participant]);
    const g = perPerson.get(key) ?? { condition: s.condition, block: s.block, sum: 0, n: 0 };
    g.sum += s.tp;
    g.n++;
    perPerson.set(key, g);
  }
  const perBlock = new Map<string, { condition: string; block: number; sum: number; n: number }>();
  for (const g of perPerson.values()) {
    const key = JSON.stringify([g.condition, g.block]);
    const b = perBlock.get(key) ?? { condition: g.condition, block: g.block, sum: 0, n: 0 };
    b.sum += g.sum / g.n;
    b.n++;
    perBlock.set(key, b);
  }
  return [...perBlock.values()]
    .map((b) => ({ condition: b.condition, block: b.block, tp: b.sum / b.n, participants: b.n }))
    .sort((a, b) => (a.condition === b.condition ? a.block - b.block : a.condition < b.condition ? -1 : 1));
}
