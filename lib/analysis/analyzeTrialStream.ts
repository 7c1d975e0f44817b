import type { Readable } from "node:stream";
import { BETWEEN_PREFIX, FACTOR_PREFIX } from "../trials/columns";
import { forEachTrialRow } from "../trials/forEachTrialRow";
import { buildResult } from "./buildResult";
import { analysisOptionsSchema, type AnalysisOptionsInput } from "./options";
import type { PathAccuracy } from "./pathAccuracy";
import type { AnalysisResult } from "./result";
import { TrialAccumulator } from "./trialAccumulator";

export interface StreamAnalysisOptions extends AnalysisOptionsInput {
  /** Legacy table without coordinates: widths from error rates. */
  legacy?: boolean;
  /** Which CSV reader (see forEachTrialRow): "auto" (default, fast path for plain lines) or "csv-parse". */
  parser?: "auto" | "csv-parse";
}

/** The f_ and b_ factor names of a header, in column order. */
export function factorOrderOf(header: readonly string[]): string[] {
  return header
    .map((h) => h.trim())
    .filter((h) => (h.startsWith(FACTOR_PREFIX) && h.length > FACTOR_PREFIX.length) || (h.startsWith(BETWEEN_PREFIX) && h.length > BETWEEN_PREFIX.length))
    .map((h) => h.slice(2));
}

/**
 * Streams a trial-table CSV (forEachTrialRow) straight into the analysis without keeping rows: the entry
 * point for uploads (give `file` the upload's name so errors read `NAME:LINE:COLUMN: message`).
 *
 * Cost: O(bytes); memory O(sequences + 50 bytes × movements).
 * @throws ZodError on bad options; TrialTableError (rejects) on any bad input.
 * @example await analyzeTrialStream(fs.createReadStream("t.csv"), { file: "t.csv" }) // {unit: "px", …}
 */
export async function analyzeTrialStream(input: Readable, options: StreamAnalysisOptions = {}, pathMeasures?: ReadonlyMap<string, PathAccuracy>): Promise<AnalysisResult> {
  const { legacy, parser, ...rest } = options;
  const opts = analysisOptionsSchema.parse(rest);
  const acc = new TrialAccumulator(opts);
  const summary =
    legacy === true
      ? await forEachTrialRow(input, { file: opts.file, legacy: true, parser }, (row) => acc.addLegacy(row))
      : await forEachTrialRow(input, { file: opts.file, legacy: false, parser }, (row) => acc.add(row));
  return buildResult(acc, opts, factorOrderOf(summary.header), pathMeasures);
}
