import type { LegacyTrialRow, TrialRow } from "../trials/trialRow";
import { buildResult } from "./buildResult";
import { analysisOptionsSchema, type AnalysisOptionsInput } from "./options";
import type { PathAccuracy } from "./pathAccuracy";
import type { AnalysisResult } from "./result";
import { TrialAccumulator } from "./trialAccumulator";

/**
 * Analyses a trial table held in memory (ISO 9241-411:2012 measures, mean of means, Fitts
 * regression, mixed-design statistics; see docs/analysis.md). Rows may carry `line` for error
 * messages. `pathMeasures` maps movementKey(...) to the movement's path accuracy (pathAccuracy),
 * `order` the factor names in column order.
 *
 * Cost: O(rows) plus the statistics.
 * @throws ZodError on bad options; TrialTableError on bad input (a sequence with fewer than 2
 *   movements, A or W changing within a sequence, a start on the target centre, factor levels
 *   that disagree within a condition, a between factor that changes within a participant or has
 *   one level).
 * @example analyzeTrials(rows, { start: "actual", exclude: "misfire", unit: "px" }).conditions[0].tp.mean // 4.21…
 */
export function analyzeTrials(
  rows: Iterable<TrialRow & { line?: number }>,
  options: AnalysisOptionsInput = {},
  pathMeasures?: ReadonlyMap<string, PathAccuracy>,
  order?: readonly string[],
): AnalysisResult {
  const opts = analysisOptionsSchema.parse(options);
  const acc = new TrialAccumulator(opts);
  for (const row of rows) acc.add(row);
  return buildResult(acc, opts, order, pathMeasures);
}

/**
 * Analyses a legacy trial table without selection coordinates: Ae = A and We from the error rate
 * (MacKenzie 1992), flagged `widthMethod: "errorRate"`; the misfire rule cannot apply.
 *
 * Cost: O(rows) plus the statistics.
 * @throws as analyzeTrials.
 */
export function analyzeLegacyTrials(rows: Iterable<LegacyTrialRow & { line?: number }>, options: AnalysisOptionsInput = {}): AnalysisResult {
  const opts = analysisOptionsSchema.parse(options);
  const acc = new TrialAccumulator(opts);
  for (const row of rows) acc.addLegacy(row);
  return buildResult(acc, opts);
}
