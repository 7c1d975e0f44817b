import { aggregate } from "./aggregate";
import { applyExclusions } from "./applyExclusions";
import { betweenGroups } from "./betweenGroups";
import { conditionFactors } from "./conditionFactors";
import type { AnalysisOptions } from "./options";
import type { PathAccuracy } from "./pathAccuracy";
import type { AnalysisResult } from "./result";
import { summarizeSequences } from "./summarizeSequences";
import type { TrialAccumulator } from "./trialAccumulator";

/**
 * The exclusion rules and the per-sequence measures of what an accumulator read, without the
 * statistics above them (sequenceSummaries; a participant's own page uses it alone).
 *
 * Cost: O(movements + s log s).
 * @throws TrialTableError when a sequence has fewer than 2 movements.
 */
export function sequenceSummaries(acc: TrialAccumulator, options: AnalysisOptions, pathMeasures?: ReadonlyMap<string, PathAccuracy>) {
  const rule = acc.legacy ? (options.exclude === "mt3sd" || options.exclude === "misfire+mt3sd" ? "mt3sd" : "none") : options.exclude;
  const exclusions = applyExclusions(acc.movements, acc.sequences, rule, options.dropFlagged, acc.legacy);
  const summaries = summarizeSequences(acc.movements, acc.sequences, exclusions.keep, acc.legacy ? "errorRate" : "effective", options.file, pathMeasures);
  return { ...exclusions, ...summaries };
}

/**
 * Turns what the accumulator read into the analysis result (contract keys first, additions after):
 * checks the design (condition factor levels, between factors), applies the exclusion rules,
 * summarises the sequences and aggregates. `order` lists the factor names in column order (the
 * header's f_ and b_ columns; default: the first row's f_ then b_ names). `pathMeasures` (by
 * movementKey) adds path accuracy.
 *
 * Cost: O(movements + s log s) plus the statistics.
 * @throws TrialTableError when a sequence has fewer than 2 movements, a condition's factor levels
 *   disagree, or a between factor has one level or shares its name with a within factor.
 */
export function buildResult(acc: TrialAccumulator, options: AnalysisOptions, order?: readonly string[], pathMeasures?: ReadonlyMap<string, PathAccuracy>): AnalysisResult {
  return buildResultWithKeep(acc, options, order, pathMeasures).result;
}

/**
 * buildResult, also returning which movements the exclusion rules kept (1) or removed (0), in the
 * order they were added (for plots that must show the same movements as the statistics).
 *
 * Cost and throws as buildResult.
 */
export function buildResultWithKeep(
  acc: TrialAccumulator,
  options: AnalysisOptions,
  order?: readonly string[],
  pathMeasures?: ReadonlyMap<string, PathAccuracy>,
): { result: AnalysisResult; keep: Uint8Array } {
  const widthMethod = acc.legacy ? "errorRate" : "effective";
  const factors = conditionFactors(acc.sequences, options.file);
  const withinNames = [...new Set([...factors.values()].flatMap((f) => Object.keys(f)))];
  const groups = betweenGroups(acc.participants, withinNames, options.file);
  const { keep, counts, timeoutsKept, sequences, dropped, pathMovements } = sequenceSummaries(acc, options, pathMeasures);
  const rest = aggregate(sequences, factors, groups, order ?? acc.factorOrder ?? [], options.anova);
  const excluded = Object.values(counts).reduce((a, b) => a + b, 0);
  const { cells, conditions, regression, anova, posthoc, ...extra } = rest;
  const result: AnalysisResult = {
    unit: options.unit,
    start: acc.legacy ? "nominal" : options.start,
    exclude: acc.legacy && options.exclude === "misfire" ? "none" : options.exclude,
    excluded,
    sequences,
    cells,
    conditions,
    regression,
    anova,
    posthoc,
    geometry: options.geometry,
    exclusions: counts,
    dropFlagged: [...options.dropFlagged],
    timeoutsKept,
    widthMethod,
    movements: acc.movements.length,
    sequencesDropped: dropped,
    ...extra,
    notes: [...new Set(extra.notes)],
  };
  if (dropped.length > 0) result.notes.unshift(`${dropped.length} sequence(s) left out of every summary: ${[...new Set(dropped.map((d) => d.reason))].join("; ")}`);
  if (timeoutsKept > 0) result.notes.push(`${timeoutsKept} time-out(s) kept and counted as errors (their end points and times enter We and MT); remove them with the timed_out flag`);
  if (acc.legacy) result.notes.unshift("widths from error rates (legacy table without coordinates): We = W·2.066/z(1 − E/2), MacKenzie 1992");
  if (pathMovements.length > 0) result.pathMovements = pathMovements;
  return { result, keep };
}
