import type { Readable } from "node:stream";
import { CsvError, parse } from "csv-parse";
import { makeRowReader } from "./rowReader";
import type { LegacyTrialRow, Located, TrialRow } from "./trialRow";
import { TrialTableError } from "./trialTableError";

export interface TrialTableReadOptions {
  /** Name used in error messages (`FILE:LINE:COLUMN: message`). */
  file: string;
  /** Legacy tables: coordinate columns are not required (width from error rate). */
  legacy?: boolean;
  /** Line number of the first line of `input` (for a slice of a larger file); default 1. */
  firstLine?: number;
  /** `input` starts with the header row (default true); when false, `header` gives it. */
  header?: readonly string[];
}

export interface TrialTableReadSummary {
  /** Rows passed to the callback. */
  rows: number;
  /** Lines read (csv-parse's count, including the header). */
  lines: number;
  header: readonly string[];
}

function csvErrorToTrialError(err: CsvError, file: string, offset: number, header: readonly string[] | undefined): TrialTableError {
  const line = (typeof err.lines === "number" ? err.lines : 1) + offset;
  if (err.code === "CSV_RECORD_INCONSISTENT_FIELDS_LENGTH") {
    const got = Array.isArray(err.record) ? err.record.length : Number.NaN;
    const missing = header && got < header.length ? header[got] : undefined;
    return new TrialTableError(
      { file, line, column: missing ?? "(row)" },
      `expected ${header?.length ?? "?"} fields, got ${got}`,
    );
  }
  return new TrialTableError({ file, line, column: typeof err.column === "number" && header?.[err.column] ? header[err.column]! : "(row)" }, err.message.split("\n")[0]!);
}

/**
 * Streams a trial table (CSV) through csv-parse and hands each validated row to `onRow`, without
 * keeping rows in memory. Rows arrive in file order with their 1-based line (csv-parse's live
 * line counter, read synchronously in the flowing-mode handler).
 *
 * Cost: O(bytes); memory O(1) beyond what `onRow` keeps.
 * @throws TrialTableError (rejects) on an empty file, a table without movements, a missing column,
 *   a non-number, a bad hit value, W ≤ 0, or a row with the wrong number of fields.
 */
export function forEachTrialRow(input: Readable, options: TrialTableReadOptions & { legacy?: false }, onRow: (row: Located<TrialRow>) => void): Promise<TrialTableReadSummary>;
export function forEachTrialRow(input: Readable, options: TrialTableReadOptions & { legacy: true }, onRow: (row: Located<LegacyTrialRow>) => void): Promise<TrialTableReadSummary>;
export function forEachTrialRow(
  input: Readable,
  options: TrialTableReadOptions,
  onRow: ((row: Located<TrialRow>) => void) | ((row: Located<LegacyTrialRow>) => void),
): Promise<TrialTableReadSummary> {
  const { file } = options;
  const offset = (options.firstLine ?? 1) - 1;
  const legacy = options.legacy === true;
  return new Promise((resolve, reject) => {
    const parser = parse({ bom: true, skip_empty_lines: true, columns: false });
    let header: readonly string[] | undefined = options.header;
    let reader: ((fields: readonly string[], line: number) => Located<TrialRow> | Located<LegacyTrialRow>) | undefined;
    let rows = 0;
    let failed = false;
    const fail = (err: unknown) => {
      if (failed) return;
      failed = true;
      input.unpipe(parser);
      input.destroy();
      parser.destroy();
      reject(err instanceof CsvError ? csvErrorToTrialError(err, file, offset, header) : err);
    };
    const build = (h: readonly string[]) => (legacy ? makeRowReader(h, file, true) : makeRowReader(h, file, false));
    try {
      if (header) reader = build(header);
    } catch (err) {
      fail(err);
      return;
    }
    parser.on("data", (fields: string[]) => {
      if (failed) return;
      try {
        if (!reader) {
          header = fields;
          reader = build(fields);
          return;
        }
        const row = reader(fields, parser.info.lines + offset);
        rows++;
        (onRow as (r: Located<TrialRow> | Located<LegacyTrialRow>) => void)(row);
      } catch (err) {
        fail(err);
      }
    });
    parser.on("error", fail);
    input.on("error", (err) => fail(new TrialTableError({ file, line: 1, column: "(file)" }, `cannot read: ${err.message}`)));
    parser.on("end", () => {
      if (failed) return;
      if (!header) {
        fail(new TrialTableError({ file, line: 1 + offset, column: "(header)" }, "empty file, expected a header row"));
        return;
      }
      if (rows === 0 && options.header === undefined) {
        fail(new TrialTableError({ file, line: 2 + offset, column: "(row)" }, "the table has no movements"));
        return;
      }
      resolve({ rows, lines: parser.info.lines, header });
    });
    input.pipe(parser);
  });
}
