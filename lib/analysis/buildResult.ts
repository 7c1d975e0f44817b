import { aggregate } from "./aggregate";
import { conditionFactors } from "./conditionFactors";
import type { AnalysisOptions } from "./options";
import type { AnalysisResult } from "./result";
import type { SequenceState } from "./sequenceState";
import { summarizeSequences } from "./summarizeSequences";
import type { TrialAccumulator } from "./trialAccumulator";

/**
 * Turns accumulated sequence totals into the analysis result (contract keys first, additions after).
 *
 * Cost: O(s log s) plus the statistics.
 * @throws TrialTableError when a sequence has fewer than 2 movements or a condition's factor
 *   levels disagree.
 */
export function buildResult(
  states: Iterable<SequenceState>,
  options: AnalysisOptions,
  widthMethod: "effective" | "errorRate",
  pathMovements?: TrialAccumulator["pathMovements"],
): AnalysisResult {
  const all = [...states];
  const { sequences, dropped } = summarizeSequences(all, widthMethod, options.file);
  const factors = conditionFactors(all, options.file);
  const rest = aggregate(sequences, factors, options.anova);
  const excluded = all.reduce((n, s) => n + s.excluded, 0);
  const { cells, conditions, regression, anova, posthoc, ...extra } = rest;
  const legacy = widthMethod === "errorRate";
  const result: AnalysisResult = {
    unit: options.unit,
    start: legacy ? "nominal" : options.start,
    exclude: legacy ? "none" : options.exclude,
    excluded,
    sequences,
    cells,
    conditions,
    regression,
    anova,
    posthoc,
    widthMethod,
    movements: all.reduce((n, s) => n + s.rows, 0),
    sequencesDropped: dropped.map((s) => ({ participant: s.participant, condition: s.condition, block: s.block, sequence: s.sequence, kept: s.kept })),
    ...extra,
    notes: [...new Set(extra.notes)],
  };
  if (legacy) result.notes.unshift("widths from error rates (legacy table without coordinates): We = W·2.066/z(1 − E/2), MacKenzie 1992");
  if (pathMovements && pathMovements.length > 0) result.pathMovements = pathMovements;
  return result;
}
