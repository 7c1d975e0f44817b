import { TrialTableError } from "../trials/trialTableError";
import { nominalIndexOfDifficulty } from "../task/nominalIndexOfDifficulty";
import { EFFECTIVE_WIDTH_FACTOR } from "./effectiveWidth";
import type { SequenceSummary } from "./result";
import { PATH_KEYS, type SequenceState } from "./sequenceState";
import { widthFromErrorRate } from "./widthFromErrorRate";

const collator = new Intl.Collator("en", { numeric: true });

/** Orders sequences by participant, condition, block, sequence (natural order of codes). */
export function compareSequences(
  a: { participant: string; condition: string; block: number; sequence: number },
  b: { participant: string; condition: string; block: number; sequence: number },
): number {
  return collator.compare(a.participant, b.participant) || collator.compare(a.condition, b.condition) || a.block - b.block || a.sequence - b.sequence;
}

export { collator as codeCollator };

/**
 * Per-sequence measures from running totals (ISO 9241-411:2012; Soukoreff & MacKenzie 2004):
 * Ae = mean(a + dx), SDx = sample SD of dx, We = 4.133·SDx, IDe = log2(Ae/We + 1), MT = mean time,
 * TP = IDe/MT. In "errorRate" mode (legacy tables) Ae = A and We comes from the error rate
 * (MacKenzie 1992), SDx is NaN.
 *
 * Cost: O(s log s) for s sequences.
 * @throws TrialTableError when a sequence has fewer than 2 movements in the table.
 */
export function summarizeSequences(
  states: Iterable<SequenceState>,
  widthMethod: "effective" | "errorRate",
  file: string,
): { sequences: SequenceSummary[]; dropped: SequenceState[] } {
  const sorted = [...states].sort(compareSequences);
  const sequences: SequenceSummary[] = [];
  const dropped: SequenceState[] = [];
  for (const s of sorted) {
    if (s.rows < 2) {
      throw new TrialTableError(
        { file, line: s.firstLine, column: "sequence" },
        `sequence ${s.sequence} of ${s.participant} in ${s.condition}, block ${s.block}, has ${s.rows} movement; at least 2 are needed`,
      );
    }
    if (s.kept < 2) {
      dropped.push(s);
      continue;
    }
    const errorRate = s.misses / s.kept;
    const ae = s.sumDistance / s.kept;
    const sdx = widthMethod === "effective" ? Math.sqrt(s.dxM2 / (s.kept - 1)) : Number.NaN;
    const we = widthMethod === "effective" ? EFFECTIVE_WIDTH_FACTOR * sdx : widthFromErrorRate(s.width, Math.min(errorRate, 0.999999));
    const ide = Math.log2(ae / we + 1);
    const mt = s.sumTimeMs / s.kept;
    const summary: SequenceSummary = {
      participant: s.participant,
      condition: s.condition,
      block: s.block,
      sequence: s.sequence,
      amplitude: s.amplitude,
      width: s.width,
      n: s.kept,
      errorRate,
      ae,
      sdx,
      we,
      ide,
      mt,
      tp: mt > 0 ? ide / (mt / 1000) : Number.NaN,
      id: nominalIndexOfDifficulty(s.amplitude, s.width),
      excluded: s.excluded,
    };
    if (s.pathCount > 0) {
      const path = { tre: 0, tac: 0, mdc: 0, odc: 0, mv: 0, me: 0, mo: 0, movements: s.pathCount };
      for (const k of PATH_KEYS) path[k] = s.pathSums[k] / s.pathCount;
      summary.path = path;
    }
    sequences.push(summary);
  }
  return { sequences, dropped };
}
