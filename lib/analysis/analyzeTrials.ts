import type { Point } from "../task/point";
import type { LegacyTrialRow, TrialRow } from "../trials/trialRow";
import { buildResult } from "./buildResult";
import { analysisOptionsSchema, type AnalysisOptionsInput } from "./options";
import type { AnalysisResult } from "./result";
import { TrialAccumulator } from "./trialAccumulator";

/**
 * Analyses a trial table held in memory (ISO 9241-411:2012 measures, mean of means, Fitts
 * regression, repeated-measures statistics; see docs/analysis.md). Rows may carry `line` for error
 * messages. `paths` maps movementKey(...) to the movement's sampled cursor path for path accuracy.
 *
 * Cost: O(rows) plus the statistics.
 * @throws ZodError on bad options; TrialTableError on bad input (a sequence with fewer than 2
 *   movements, A or W changing within a sequence, a start on the target centre, factor levels
 *   that disagree within a condition).
 * @example analyzeTrials(rows, { start: "actual", exclude: "misfire", unit: "px" }).conditions[0].tp.mean // 4.21…
 */
export function analyzeTrials(
  rows: Iterable<TrialRow & { line?: number }>,
  options: AnalysisOptionsInput = {},
  paths?: ReadonlyMap<string, readonly Point[]>,
): AnalysisResult {
  const opts = analysisOptionsSchema.parse(options);
  const acc = new TrialAccumulator(opts, paths);
  for (const row of rows) acc.add(row);
  return buildResult(acc.states.values(), opts, "effective", acc.pathMovements);
}

/**
 * Analyses a legacy trial table without selection coordinates: Ae = A and We from the error rate
 * (MacKenzie 1992), flagged `widthMethod: "errorRate"`; no misfire exclusion is possible.
 *
 * Cost: O(rows) plus the statistics.
 * @throws as analyzeTrials.
 */
export function analyzeLegacyTrials(rows: Iterable<LegacyTrialRow & { line?: number }>, options: AnalysisOptionsInput = {}): AnalysisResult {
  const opts = analysisOptionsSchema.parse(options);
  const acc = new TrialAccumulator(opts);
  for (const row of rows) acc.addLegacy(row);
  return buildResult(acc.states.values(), opts, "errorRate");
}
