import type { Readable } from "node:stream";
import type { Point } from "../task/point";
import { forEachTrialRow } from "../trials/forEachTrialRow";
import { buildResult } from "./buildResult";
import { analysisOptionsSchema, type AnalysisOptionsInput } from "./options";
import type { AnalysisResult } from "./result";
import { TrialAccumulator } from "./trialAccumulator";

export interface StreamAnalysisOptions extends AnalysisOptionsInput {
  /** Legacy table without coordinates: widths from error rates. */
  legacy?: boolean;
  /** Which CSV reader (see forEachTrialRow): "auto" (default, fast path for plain lines) or "csv-parse". */
  parser?: "auto" | "csv-parse";
}

/**
 * Streams a trial-table CSV (forEachTrialRow) straight into the analysis without keeping rows: the entry
 * point for uploads (give `file` the upload's name so errors read `NAME:LINE:COLUMN: message`).
 *
 * Cost: O(bytes); memory O(sequences).
 * @throws ZodError on bad options; TrialTableError (rejects) on any bad input.
 * @example await analyzeTrialStream(fs.createReadStream("t.csv"), { file: "t.csv" }) // {unit: "px", …}
 */
export async function analyzeTrialStream(
  input: Readable,
  options: StreamAnalysisOptions = {},
  paths?: ReadonlyMap<string, readonly Point[]>,
): Promise<AnalysisResult> {
  const { legacy, parser, ...rest } = options;
  const opts = analysisOptionsSchema.parse(rest);
  const acc = new TrialAccumulator(opts, paths);
  if (legacy === true) {
    await forEachTrialRow(input, { file: opts.file, legacy: true, parser }, (row) => acc.addLegacy(row));
    return buildResult(acc.states.values(), opts, "errorRate");
  }
  await forEachTrialRow(input, { file: opts.file, legacy: false, parser }, (row) => acc.add(row));
  return buildResult(acc.states.values(), opts, "effective", acc.pathMovements);
}
