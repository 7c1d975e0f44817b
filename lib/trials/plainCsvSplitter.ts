import { emptyRecord, ensureCapacity, type RecordFields } from "./recordFields";

/**
 * Called for each record the splitter finds: the fields (ranges of the chunk's text, in a
 * RecordFields the splitter reuses for the next record) and the 1-based line the record is on
 * (csv-parse's `info.lines` at that record).
 */
export type PlainRecordHandler = (fields: RecordFields, line: number) => void;

const QUOTE = 34;
const CR = 13;
const LF = 10;

/**
 * Plain CSV splitter (PlainCsvSplitter): a fast reader for the common case of a comma-separated
 * file without any double quote, which yields exactly the records csv-parse yields with the
 * options `{ bom: true, skip_empty_lines: true, columns: false }` on the same bytes. It covers only
 * what it can reproduce exactly and hands everything else back:
 * - the line ending is found as csv-parse finds it (the first CR LF or LF; a lone CR is handed
 *   back), and every later line must end the same way (LF files with no CR at all, CR LF files with
 *   no other CR or LF);
 * - a line with a `"` (quoting), a UTF-16 byte order mark, or anything else outside these rules
 *   stops the splitter: `push`/`end` return the raw bytes from the start of that line on, for the
 *   caller to give to csv-parse behind a prefix that recreates the parser's state
 *   ({@link PlainCsvSplitter.resumePrefix}).
 * Empty lines are skipped but counted, as csv-parse counts them; the UTF-8 byte order mark is
 * dropped. Source: RFC 4180 §2 (records, fields, CR LF) and csv-parse 7's record-delimiter
 * discovery and line counting (read from its source); a property test checks the two agree.
 *
 * Cost: O(bytes); memory O(longest line).
 * @throws whatever `onRecord` throws (the field-count check is the caller's, as with csv-parse).
 * @example
 * const s = new PlainCsvSplitter((f, line) => console.log(line, recordStrings(f)));
 * s.push(Buffer.from("a,b\r\n\r\n1,2\r\n")); s.end() // logs 1 ["a","b"], 3 ["1","2"]; returns null
 */
export class PlainCsvSplitter {
  /** csv-parse's line counter: 1 + the line endings consumed so far. */
  lines = 1;
  /** The record delimiter once found. */
  delimiter: "\n" | "\r\n" | undefined;
  /** Number of fields of the first record (csv-parse's expected record length). */
  firstRecordLength: number | undefined;
  private leftover: Buffer | undefined;
  private started = false;
  private readonly onRecord: PlainRecordHandler;
  private readonly record: RecordFields = emptyRecord();

  constructor(onRecord: PlainRecordHandler) {
    this.onRecord = onRecord;
  }

  /**
   * Feeds bytes. Returns null when all complete lines were read, or the raw bytes from the first
   * line the splitter cannot read exactly (the splitter is then spent).
   */
  push(chunk: Buffer): Buffer | null {
    let data = this.leftover === undefined || this.leftover.length === 0 ? chunk : Buffer.concat([this.leftover, chunk]);
    this.leftover = undefined;
    if (!this.started) {
      if (data.length < 3) {
        this.leftover = data;
        return null;
      }
      const start = this.startOf(data);
      if (start < 0) return data;
      data = data.subarray(start);
      this.started = true;
    }
    if (this.delimiter === undefined) {
      const found = this.findDelimiter(data, false);
      if (found === "wait") {
        this.leftover = data;
        return null;
      }
      if (found === "stop") return data;
    }
    const last = data.lastIndexOf(LF);
    if (last === -1) {
      this.leftover = data;
      return null;
    }
    const stopAt = this.readLines(data, last + 1, false);
    if (stopAt >= 0) return data.subarray(stopAt);
    if (last + 1 < data.length) this.leftover = data.subarray(last + 1);
    return null;
  }

  /** Ends the input: reads the last line (without line ending). Same return as `push`. */
  end(): Buffer | null {
    let data = this.leftover ?? Buffer.alloc(0);
    this.leftover = undefined;
    if (!this.started) {
      const start = this.startOf(data);
      if (start < 0) return data;
      data = data.subarray(start);
      this.started = true;
    }
    if (data.length === 0) return null;
    if (this.delimiter === undefined && this.findDelimiter(data, true) === "stop") return data;
    const stopAt = this.readLines(data, data.length, true);
    return stopAt >= 0 ? data.subarray(stopAt) : null;
  }

  /**
   * Text that, given to a fresh csv-parse (same options) before the bytes `push`/`end` returned,
   * puts it in the state this splitter had reached: the same record delimiter, the same expected
   * record length (a first record of that many empty fields, which the caller skips) and the same
   * line count (empty lines, which csv-parse skips but counts).
   */
  resumePrefix(): { text: string; skipFirstRecord: boolean } {
    const delimiter = this.delimiter ?? "\n";
    if (this.firstRecordLength === undefined) return { text: delimiter.repeat(this.lines - 1), skipFirstRecord: false };
    const dummy = '""' + ",".repeat(this.firstRecordLength - 1);
    return { text: dummy + delimiter.repeat(this.lines - 1), skipFirstRecord: true };
  }

  /** Offset after a UTF-8 byte order mark; −1 for a UTF-16 one (csv-parse switches encoding). */
  private startOf(data: Buffer): number {
    if (data.length >= 3 && data[0] === 0xef && data[1] === 0xbb && data[2] === 0xbf) return 3;
    if (data.length >= 2 && data[0] === 0xff && data[1] === 0xfe) return -1;
    return 0;
  }

  /** csv-parse takes the first CR LF, LF or CR (outside quotes) as the record delimiter. */
  private findDelimiter(data: Buffer, atEnd: boolean): "found" | "wait" | "stop" {
    const lf = data.indexOf(LF);
    const cr = data.indexOf(CR);
    const quote = data.indexOf(QUOTE);
    const first = cr === -1 ? lf : lf === -1 ? cr : Math.min(cr, lf);
    if (quote !== -1 && (first === -1 || quote < first)) return "stop";
    if (first === -1) return atEnd ? "found" : "wait";
    if (first === lf) {
      this.delimiter = "\n";
      return "found";
    }
    if (cr + 1 >= data.length) return atEnd ? "stop" : "wait";
    if (data[cr + 1] !== LF) return "stop";
    this.delimiter = "\r\n";
    return "found";
  }

  /**
   * Reads the lines of data[0, end) (end is just after an LF, or the input's end). Returns −1, or
   * the byte offset of the first line it cannot read exactly.
   */
  private readLines(data: Buffer, end: number, atEnd: boolean): number {
    const text = data.toString("utf8", 0, end);
    const crlf = this.delimiter === "\r\n";
    let quote = text.indexOf('"');
    let cr = crlf ? -2 : text.indexOf("\r");
    const n = text.length;
    let pos = 0;
    let consumed = 0;
    while (pos < n) {
      let nl = text.indexOf("\n", pos);
      const last = nl === -1;
      if (last) nl = n;
      let stop = nl;
      if (crlf) {
        if (cr !== -1 && cr < pos) cr = text.indexOf("\r", pos);
        if (last) {
          if (cr !== -1) return this.byteOffset(data, consumed);
        } else {
          if (cr !== nl - 1 || nl - 1 < pos) return this.byteOffset(data, consumed);
          stop = nl - 1;
        }
      } else if (cr !== -1 && cr < nl) {
        return this.byteOffset(data, consumed);
      }
      if (quote !== -1 && quote < nl) return this.byteOffset(data, consumed);
      if (stop > pos) {
        // The fields as ranges of `text` (what text.slice(pos, stop).split(",") would give).
        const r = this.record;
        r.text = text;
        let count = 0;
        let from = pos;
        for (;;) {
          let comma = text.indexOf(",", from);
          if (comma === -1 || comma > stop) comma = stop;
          if (count === r.start.length) {
            r.count = count;
            ensureCapacity(r, count + 1);
          }
          r.start[count] = from;
          r.end[count] = comma;
          count++;
          if (comma === stop) break;
          from = comma + 1;
        }
        r.count = count;
        if (this.firstRecordLength === undefined) this.firstRecordLength = count;
        this.onRecord(r, this.lines);
      }
      if (last) break;
      this.lines++;
      consumed++;
      pos = nl + 1;
    }
    if (atEnd && quote !== -1) return this.byteOffset(data, consumed);
    return -1;
  }

  /** Byte offset just after the `lines`-th LF of data (exact whatever the text encoding). */
  private byteOffset(data: Buffer, lines: number): number {
    let at = 0;
    for (let i = 0; i < lines; i++) at = data.indexOf(LF, at) + 1;
    return at;
  }
}
