import type { Readable } from "node:stream";
import { CsvError, parse } from "csv-parse";
import { PlainCsvSplitter } from "./plainCsvSplitter";
import { emptyRecord, recordFromStrings, recordStrings, type RecordFields } from "./recordFields";
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
  /**
   * "auto" (default): lines without a double quote go through a fast splitter (PlainCsvSplitter)
   * that yields what csv-parse yields, anything else through csv-parse; "csv-parse": csv-parse only
   * (the reference the fast path is tested against).
   */
  parser?: "auto" | "csv-parse";
}

export interface TrialTableReadSummary {
  /** Rows passed to the callback. */
  rows: number;
  /** Lines read (csv-parse's count, including the header). */
  lines: number;
  header: readonly string[];
}

function fieldCountError(file: string, line: number, got: number, header: readonly string[] | undefined): TrialTableError {
  const missing = header && got < header.length ? header[got] : undefined;
  return new TrialTableError({ file, line, column: missing ?? "(row)" }, `expected ${header?.length ?? "?"} fields, got ${got}`);
}

function csvErrorToTrialError(err: CsvError, file: string, offset: number, header: readonly string[] | undefined): TrialTableError {
  const line = (typeof err.lines === "number" ? err.lines : 1) + offset;
  if (err.code === "CSV_RECORD_INCONSISTENT_FIELDS_LENGTH") {
    return fieldCountError(file, line, Array.isArray(err.record) ? err.record.length : Number.NaN, header);
  }
  return new TrialTableError({ file, line, column: typeof err.column === "number" && header?.[err.column] ? header[err.column]! : "(row)" }, err.message.split("\n")[0]!);
}

/**
 * Streams a trial table (CSV) and hands each validated row to `onRow`, without keeping rows in
 * memory. Rows arrive in file order with their 1-based line. Lines without a double quote are
 * split by PlainCsvSplitter (about 4× faster than csv-parse here, measured); from the first line
 * it cannot read exactly (a quote, unusual line endings), the rest goes through csv-parse, started
 * in the same state (same delimiter, expected field count and line count), so records, lines and
 * error messages are csv-parse's either way (property test in trials.test.ts).
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
  const emit = onRow as (r: Located<TrialRow> | Located<LegacyTrialRow>) => void;
  return new Promise((resolve, reject) => {
    let header: readonly string[] | undefined = options.header;
    let reader: ((fields: RecordFields, line: number) => Located<TrialRow> | Located<LegacyTrialRow>) | undefined;
    let rows = 0;
    let failed = false;
    let parser: ReturnType<typeof parse> | undefined;
    const fail = (err: unknown) => {
      if (failed) return;
      failed = true;
      if (parser) {
        input.unpipe(parser);
        parser.destroy();
      }
      input.destroy();
      reject(err instanceof CsvError ? csvErrorToTrialError(err, file, offset, header) : err);
    };
    const build = (h: readonly string[]) => (legacy ? makeRowReader(h, file, true) : makeRowReader(h, file, false));
    try {
      if (header) reader = build(header);
    } catch (err) {
      fail(err);
      return;
    }
    /** One record (either reader), line without offset; throws TrialTableError. */
    const record = (fields: RecordFields, line: number) => {
      if (!reader) {
        header = recordStrings(fields);
        reader = build(header);
        return;
      }
      const row = reader(fields, line + offset);
      rows++;
      emit(row);
    };
    const finish = (lines: number) => {
      if (failed) return;
      if (!header) {
        fail(new TrialTableError({ file, line: 1 + offset, column: "(header)" }, "empty file, expected a header row"));
        return;
      }
      if (rows === 0 && options.header === undefined) {
        fail(new TrialTableError({ file, line: 2 + offset, column: "(row)" }, "the table has no movements"));
        return;
      }
      resolve({ rows, lines, header });
    };
    input.on("error", (err) => fail(new TrialTableError({ file, line: 1, column: "(file)" }, `cannot read: ${err.message}`)));

    /**
     * csv-parse from here on: `prefix` (if any) recreates the splitter's state, then `rest`, then
     * the rest of the input (or nothing more when the input has already ended).
     */
    const startCsvParse = (prefix: { text: string; skipFirstRecord: boolean } | undefined, rest: Buffer | undefined, ended: boolean) => {
      const p = parse({ bom: true, skip_empty_lines: true, columns: false });
      parser = p;
      let skip = prefix?.skipFirstRecord === true;
      const scratch = emptyRecord();
      p.on("data", (fields: string[]) => {
        if (failed) return;
        if (skip) {
          skip = false;
          return;
        }
        try {
          record(recordFromStrings(fields, scratch), p.info.lines);
        } catch (err) {
          fail(err);
        }
      });
      p.on("error", fail);
      p.on("end", () => finish(p.info.lines));
      if (prefix && prefix.text.length > 0) p.write(prefix.text);
      if (rest && rest.length > 0) p.write(rest);
      if (ended) p.end();
      else input.pipe(p);
    };

    if (options.parser === "csv-parse") {
      startCsvParse(undefined, undefined, false);
      return;
    }
    const splitter = new PlainCsvSplitter((fields, line) => {
      const expected = splitter.firstRecordLength;
      // csv-parse compares every record with the first one (the header, or a slice's first row).
      if (expected !== undefined && fields.count !== expected) throw fieldCountError(file, line + offset, fields.count, header);
      record(fields, line);
    });
    const handOver = (rest: Buffer, ended: boolean) => {
      input.off("data", onData);
      input.off("end", onEnd);
      startCsvParse(splitter.resumePrefix(), rest, ended);
    };
    const step = (read: () => Buffer | null, ended: boolean) => {
      if (failed) return;
      let rest: Buffer | null;
      try {
        rest = read();
      } catch (err) {
        fail(err);
        return;
      }
      if (rest) handOver(rest, ended);
      else if (ended) finish(splitter.lines);
    };
    const onData = (chunk: Buffer | string) => step(() => splitter.push(typeof chunk === "string" ? Buffer.from(chunk, "utf8") : chunk), false);
    const onEnd = () => step(() => splitter.end(), true);
    input.on("data", onData);
    input.on("end", onEnd);
  });
}
