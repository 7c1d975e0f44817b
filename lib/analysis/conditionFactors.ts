import { TrialTableError } from "../trials/trialTableError";
import type { SequenceInfo } from "./sequenceInfo";

/**
 * The f_ factor levels of each condition, checked for consistency: every sequence of a condition
 * must carry the same level of every factor.
 *
 * Cost: O(s·f).
 * @throws TrialTableError naming the first line of a sequence whose level disagrees.
 */
export function conditionFactors(sequences: Iterable<SequenceInfo>, file: string): Map<string, Readonly<Record<string, string>>> {
  const byCondition = new Map<string, Readonly<Record<string, string>>>();
  for (const s of sequences) {
    const known = byCondition.get(s.condition);
    if (known === undefined) {
      byCondition.set(s.condition, s.factors);
      continue;
    }
    if (known === s.factors) continue;
    for (const [name, level] of Object.entries(s.factors)) {
      if (known[name] !== level) {
        throw new TrialTableError(
          { file, line: s.firstLine, column: `f_${name}` },
          `condition ${s.condition} has level "${known[name]}" of factor ${name} elsewhere, "${level}" here`,
        );
      }
    }
  }
  return byCondition;
}
