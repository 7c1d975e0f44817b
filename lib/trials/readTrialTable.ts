import type { Readable } from "node:stream";
import { forEachTrialRow, type TrialTableReadOptions } from "./forEachTrialRow";
import type { LegacyTrialRow, Located, TrialRow } from "./trialRow";

/**
 * Reads a whole trial table into an array of validated rows (convenience over forEachTrialRow for
 * small tables; the analysis streams instead).
 *
 * Cost: O(bytes) time and O(rows) memory.
 * @throws TrialTableError as forEachTrialRow.
 * @example await readTrialTable(Readable.from(csvText), { file: "t.csv" }) // [{participant: "P01", …, line: 2}, …]
 */
export async function readTrialTable(input: Readable, options: TrialTableReadOptions & { legacy?: false }): Promise<Located<TrialRow>[]>;
export async function readTrialTable(input: Readable, options: TrialTableReadOptions & { legacy: true }): Promise<Located<LegacyTrialRow>[]>;
export async function readTrialTable(input: Readable, options: TrialTableReadOptions): Promise<Located<TrialRow>[] | Located<LegacyTrialRow>[]> {
  if (options.legacy === true) {
    const rows: Located<LegacyTrialRow>[] = [];
    await forEachTrialRow(input, { ...options, legacy: true }, (r) => rows.push(r));
    return rows;
  }
  const rows: Located<TrialRow>[] = [];
  await forEachTrialRow(input, { ...options, legacy: false }, (r) => rows.push(r));
  return rows;
}
