import { parse } from "csv-parse/sync";
import type { MotionSample } from "./sample";

/**
 * Columns of the raw sensor stream: those of interfaces.md, then the project's optional ones —
 * pointer movement (mouse, touch drag; CSS px), pointer position (touch in cursor mode; CSS px
 * in the cursor's coordinates) and the selection marker (docs/configuration.md "Raw stream").
 */
export const sampleColumns = [
  "t_ms", "gyro_x", "gyro_y", "gyro_z", "accel_x", "accel_y", "accel_z",
  "stick_x", "stick_y", "buttons", "screen_angle", "pointer_dx", "pointer_dy",
  "pointer_x", "pointer_y", "selected",
] as const;
export type SampleColumn = (typeof sampleColumns)[number];
const requiredColumns: readonly SampleColumn[] = ["t_ms", "gyro_x", "gyro_y", "gyro_z"];

/** Bad input in a sample stream: names the file, the line (1 = header) and the column. */
export class SampleCsvError extends Error {
  readonly file: string;
  readonly line: number;
  readonly column: string;
  readonly reason: string;
  constructor(file: string, line: number, column: string, reason: string) {
    super(`${file}:${line}:${column}: ${reason}`);
    this.name = "SampleCsvError";
    this.file = file;
    this.line = line;
    this.column = column;
    this.reason = reason;
  }
}

/** A parsed stream, column-wise (compact for millions of rows). NaN marks an empty optional field. */
export interface SampleTable {
  length: number;
  columns: Record<SampleColumn, Float64Array>;
  /** Whether the header had the column at all. */
  present: Record<SampleColumn, boolean>;
  /** The columns in `sampleColumns` order (null where absent), for the parser's inner loop. */
  targets: (Float64Array | null)[];
}

function emptyTable(capacity: number, present: Record<SampleColumn, boolean>): SampleTable {
  const columns = {} as Record<SampleColumn, Float64Array>;
  for (const name of sampleColumns) columns[name] = new Float64Array(present[name] ? capacity : 0);
  const targets = sampleColumns.map((name) => (present[name] ? columns[name] : null));
  return { length: 0, columns, present, targets };
}

function countLines(text: string): number {
  let n = 0, i = -1;
  while ((i = text.indexOf("\n", i + 1)) !== -1) n++;
  return n + 1;
}

/** Checks one row's values (already numbers or NaN for empty) and stores them. */
const valueAt = (values: Float64Array, c: number): number => values[c] as number;

function storeRow(table: SampleTable, values: Float64Array, file: string, line: number): void {
  const row = table.length;
  for (let k = 0; k < 4; k++) {
    if (Number.isNaN(valueAt(values, k))) throw new SampleCsvError(file, line, sampleColumns[k] as string, "empty");
  }
  const ax = Number.isNaN(valueAt(values, 4)), ay = Number.isNaN(valueAt(values, 5)), az = Number.isNaN(valueAt(values, 6));
  if (table.present.accel_x || table.present.accel_y || table.present.accel_z) {
    if (!(ax === ay && ay === az)) {
      const missing = ax ? "accel_x" : ay ? "accel_y" : "accel_z";
      throw new SampleCsvError(file, line, missing, "empty while another acceleration field is given");
    }
  }
  const stickX = valueAt(values, 7), stickY = valueAt(values, 8);
  if (stickX < -1 || stickX > 1) throw new SampleCsvError(file, line, "stick_x", "outside -1..1");
  if (stickY < -1 || stickY > 1) throw new SampleCsvError(file, line, "stick_y", "outside -1..1");
  const b = valueAt(values, 9);
  if (!Number.isNaN(b) && (!Number.isInteger(b) || b < 0 || b > 0xffffffff)) {
    throw new SampleCsvError(file, line, "buttons", "not a non-negative integer bitmask");
  }
  if (Number.isNaN(valueAt(values, 13)) !== Number.isNaN(valueAt(values, 14))) {
    throw new SampleCsvError(file, line, Number.isNaN(valueAt(values, 13)) ? "pointer_x" : "pointer_y", "empty while the other pointer position is given");
  }
  const sel = valueAt(values, 15);
  if (!Number.isNaN(sel) && sel !== 0 && sel !== 1) throw new SampleCsvError(file, line, "selected", "not 0 or 1");
  if (row > 0 && valueAt(values, 0) < (table.columns.t_ms[row - 1] as number)) {
    throw new SampleCsvError(file, line, "t_ms", "time goes backwards");
  }
  const targets = table.targets;
  for (let k = 0; k < targets.length; k++) {
    const target = targets[k];
    if (target) target[row] = valueAt(values, k);
  }
  table.length = row + 1;
}

const POW10 = [1, 1e1, 1e2, 1e3, 1e4, 1e5, 1e6, 1e7, 1e8, 1e9, 1e10, 1e11, 1e12, 1e13, 1e14, 1e15, 1e16, 1e17, 1e18, 1e19, 1e20, 1e21, 1e22];

/** Where scanPlainField stopped (the comma or the line end), or −1 when it gave up. */
let scanEnd = -1;
/**
 * The value scanPlainField read. A number returned from a call that the compiler does not inline
 * is boxed on the heap (one object per field: about 130 MB of garbage for a million 11-column
 * rows); written into a typed array it is not.
 */
const scanned = new Float64Array(1);

/**
 * The plain scanner, fused with finding the field's end: reads a field that is exactly
 * [-+]digits[.digits] (at most 15 significant digits, 22 decimals) or empty, ending at a comma or
 * at `stop`, sets scanEnd there and `scanned[0]` to its value (NaN when empty); for anything else
 * sets scanEnd = −1 (the caller then finds the comma and calls fastFieldValue). Such fields are
 * exact: an integer mantissa below 2^53 divided by an exact power of ten is correctly rounded
 * (Clinger's fast path, PLDI 1990).
 */
function scanPlainField(text: string, start: number, stop: number): void {
  let i = start, negative = false;
  let ch = i < stop ? text.charCodeAt(i) : 44;
  if (ch === 44) {
    scanEnd = i;
    scanned[0] = NaN; // empty field
    return;
  }
  if (ch === 45 || ch === 43) {
    negative = ch === 45;
    i++;
  }
  let mantissa = 0, digits = 0, fraction = 0, seenDot = false, sawDigit = false;
  for (; i < stop; i++) {
    ch = text.charCodeAt(i);
    if (ch >= 48 && ch <= 57) {
      sawDigit = true;
      if (mantissa !== 0 || ch !== 48) digits++;
      mantissa = mantissa * 10 + (ch - 48);
      if (seenDot) fraction++;
    } else if (ch === 46 && !seenDot) {
      seenDot = true;
    } else break;
  }
  if ((i === stop || ch === 44) && sawDigit && digits <= 15 && fraction <= 22) {
    scanEnd = i;
    const x = mantissa / (POW10[fraction] as number);
    scanned[0] = negative ? -x : x;
    return;
  }
  scanEnd = -1;
}

/**
 * Parse the decimal number in text[start, end) without creating a substring (fastFieldValue):
 * NaN for an empty field; surrounding spaces are dropped and the rest read by scanPlainField,
 * with Number() for anything but plain [-+]digits[.digits].
 */
function fastFieldValue(text: string, start: number, end: number, file: string, line: number, column: string): number {
  while (start < end && text.charCodeAt(start) === 32) start++;
  while (end > start && text.charCodeAt(end - 1) === 32) end--;
  if (start === end) return NaN;
  scanPlainField(text, start, end);
  if (scanEnd === end) return scanned[0] as number;
  return fieldValue(text.slice(start, end), file, line, column);
}

function fieldValue(raw: string, file: string, line: number, column: string): number {
  const s = raw.trim();
  if (s === "") return NaN;
  const x = Number(s);
  if (!Number.isFinite(x)) throw new SampleCsvError(file, line, column, "not a number");
  return x;
}

function headerLayout(names: string[], file: string): { index: Int16Array; present: Record<SampleColumn, boolean> } {
  // index[f] = which sample column field f feeds (−1: ignored)
  const index = new Int16Array(names.length).fill(-1);
  const present = {} as Record<SampleColumn, boolean>;
  for (const c of sampleColumns) present[c] = false;
  names.forEach((raw, f) => {
    const k = (sampleColumns as readonly string[]).indexOf(raw.trim());
    if (k >= 0) {
      if (present[sampleColumns[k] as SampleColumn]) throw new SampleCsvError(file, 1, raw.trim(), "column appears twice");
      index[f] = k;
      present[sampleColumns[k] as SampleColumn] = true;
    }
  });
  for (const c of requiredColumns) if (!present[c]) throw new SampleCsvError(file, 1, c, "missing column");
  return { index, present };
}

/**
 * Parse a raw sensor stream (parseSampleCsv).
 *
 * Purpose: read the replay format of interfaces.md (header row; `t_ms, gyro_x, gyro_y, gyro_z`
 * required; `accel_*`, `stick_*`, `buttons`, `screen_angle`, and the project's `pointer_dx/dy`,
 * `pointer_x/y` and `selected` optional, fields may be empty; other columns are ignored) into a
 * column-wise table, validating every field. Plain numeric files take a fast
 * scanner; any file containing a double quote goes through csv-parse (RFC 4180 quoting).
 * Source: interfaces.md "Raw sensor stream"; RFC 4180. Cost: O(characters).
 * @throws SampleCsvError "samples.csv:17:gyro_y: not a number" (file, line, column, reason).
 * @example parseSampleCsv("t_ms,gyro_x,gyro_y,gyro_z\n0,1,2,3\n", "a.csv").columns.gyro_z[0] // 3
 */
export function parseSampleCsv(text: string, file: string): SampleTable {
  if (text.charCodeAt(0) === 0xfeff) text = text.slice(1);
  if (text.trim() === "") throw new SampleCsvError(file, 1, "t_ms", "empty file");
  return text.includes('"') ? parseQuoted(text, file) : parsePlain(text, file);
}

function parsePlain(text: string, file: string): SampleTable {
  let end = text.indexOf("\n");
  if (end === -1) end = text.length;
  const header = text.slice(0, end).replace(/\r$/, "").split(",");
  const { index, present } = headerLayout(header, file);
  const table = emptyTable(countLines(text), present);
  // Each field goes straight into its column; every present column gets one field per row (a row
  // with fewer fields is an error), so the checks below read the row back from the columns, with
  // an absent column counting as empty, in the order storeRow checks them.
  const targets = table.targets;
  const c = table.columns;
  const tMs = c.t_ms, gyroX = c.gyro_x, gyroY = c.gyro_y, gyroZ = c.gyro_z;
  const accel = present.accel_x || present.accel_y || present.accel_z;
  const hasAx = present.accel_x, hasAy = present.accel_y, hasAz = present.accel_z;
  const hasSx = present.stick_x, hasSy = present.stick_y, hasButtons = present.buttons;
  const hasPx = present.pointer_x, hasPy = present.pointer_y, hasSelected = present.selected;
  const nFields = header.length;
  let pos = end + 1, line = 1, row = 0;
  while (pos < text.length) {
    line++;
    let lineEnd = text.indexOf("\n", pos);
    if (lineEnd === -1) lineEnd = text.length;
    let stop = lineEnd;
    if (stop > pos && text.charCodeAt(stop - 1) === 13) stop--;
    if (stop === pos) {
      pos = lineEnd + 1;
      continue; // blank line
    }
    let f = 0, start = pos;
    for (;;) {
      if (f >= nFields) throw new SampleCsvError(file, line, "(row)", `more than ${nFields} fields`);
      const k = index[f] as number;
      let comma = -1;
      if (k >= 0) {
        const target = targets[k] as Float64Array;
        scanPlainField(text, start, stop);
        comma = scanEnd;
        if (comma >= 0) target[row] = scanned[0] as number;
        else {
          comma = text.indexOf(",", start);
          if (comma === -1 || comma > stop) comma = stop;
          target[row] = fastFieldValue(text, start, comma, file, line, sampleColumns[k] as string);
        }
      } else {
        comma = text.indexOf(",", start);
        if (comma === -1 || comma > stop) comma = stop;
      }
      f++;
      if (comma === stop) break;
      start = comma + 1;
    }
    if (f < nFields) throw new SampleCsvError(file, line, (header[f] ?? "").trim(), "missing field");
    const t = tMs[row] as number;
    if (t !== t) throw new SampleCsvError(file, line, "t_ms", "empty");
    if (Number.isNaN(gyroX[row])) throw new SampleCsvError(file, line, "gyro_x", "empty");
    if (Number.isNaN(gyroY[row])) throw new SampleCsvError(file, line, "gyro_y", "empty");
    if (Number.isNaN(gyroZ[row])) throw new SampleCsvError(file, line, "gyro_z", "empty");
    if (accel) {
      const ax = !hasAx || Number.isNaN(c.accel_x[row]);
      const ay = !hasAy || Number.isNaN(c.accel_y[row]);
      const az = !hasAz || Number.isNaN(c.accel_z[row]);
      if (!(ax === ay && ay === az)) {
        const missing = ax ? "accel_x" : ay ? "accel_y" : "accel_z";
        throw new SampleCsvError(file, line, missing, "empty while another acceleration field is given");
      }
    }
    if (hasSx) {
      const v = c.stick_x[row] as number;
      if (v < -1 || v > 1) throw new SampleCsvError(file, line, "stick_x", "outside -1..1");
    }
    if (hasSy) {
      const v = c.stick_y[row] as number;
      if (v < -1 || v > 1) throw new SampleCsvError(file, line, "stick_y", "outside -1..1");
    }
    if (hasButtons) {
      const b = c.buttons[row] as number;
      if (!Number.isNaN(b) && (!Number.isInteger(b) || b < 0 || b > 0xffffffff)) {
        throw new SampleCsvError(file, line, "buttons", "not a non-negative integer bitmask");
      }
    }
    if (hasPx || hasPy) {
      const px = !hasPx || Number.isNaN(c.pointer_x[row]), py = !hasPy || Number.isNaN(c.pointer_y[row]);
      if (px !== py) throw new SampleCsvError(file, line, px ? "pointer_x" : "pointer_y", "empty while the other pointer position is given");
    }
    if (hasSelected) {
      const v = c.selected[row] as number;
      if (!Number.isNaN(v) && v !== 0 && v !== 1) throw new SampleCsvError(file, line, "selected", "not 0 or 1");
    }
    if (row > 0 && t < (tMs[row - 1] as number)) throw new SampleCsvError(file, line, "t_ms", "time goes backwards");
    row++;
    pos = lineEnd + 1;
  }
  table.length = row;
  return table;
}

function parseQuoted(text: string, file: string): SampleTable {
  let records: { record: string[]; info: { lines: number } }[];
  try {
    records = parse(text, { info: true, skip_empty_lines: true, relax_column_count: true }) as unknown as typeof records;
  } catch (error) {
    const e = error as { lines?: number; column?: number | string; message?: string };
    throw new SampleCsvError(file, e.lines ?? 1, String(e.column ?? "(row)"), "malformed CSV");
  }
  const first = records[0];
  if (!first) throw new SampleCsvError(file, 1, "t_ms", "empty file");
  const header = first.record;
  const { index, present } = headerLayout(header, file);
  const table = emptyTable(records.length, present);
  const values = new Float64Array(sampleColumns.length);
  for (let r = 1; r < records.length; r++) {
    const { record, info } = records[r] as (typeof records)[number];
    const line = info.lines;
    if (record.length > header.length) throw new SampleCsvError(file, line, "(row)", `more than ${header.length} fields`);
    if (record.length < header.length) throw new SampleCsvError(file, line, (header[record.length] ?? "").trim(), "missing field");
    values.fill(NaN);
    record.forEach((raw, f) => {
      const k = index[f] as number;
      if (k >= 0) values[k] = fieldValue(raw, file, line, sampleColumns[k] as string);
    });
    storeRow(table, values, file, line);
  }
  return table;
}

/**
 * Row i of a table as a sample, written into `out` (sampleFromTable).
 *
 * Purpose: replay millions of rows through the engine reusing one object. Source: the table
 * layout above. Cost: O(1), no allocation.
 * @throws never (i must be < table.length).
 * @example sampleFromTable(parseSampleCsv("t_ms,gyro_x,gyro_y,gyro_z\n5,1,2,3\n", "a.csv"), 0, { tMs: 0, gyroX: 0, gyroY: 0, gyroZ: 0 }).tMs // 5
 */
export function sampleFromTable(table: SampleTable, i: number, out: MotionSample): MotionSample {
  const c = table.columns, p = table.present;
  out.tMs = c.t_ms[i] as number;
  out.gyroX = c.gyro_x[i] as number;
  out.gyroY = c.gyro_y[i] as number;
  out.gyroZ = c.gyro_z[i] as number;
  // Each optional field is stored on its own branch, a number or undefined, never a value that is
  // "a number or undefined": such a value is a boxed number on V8's heap, one per field and row
  // (about 80 bytes a row of garbage with accelerometer and stick columns). `(v = column[i]) === v`
  // reads the value and is false for NaN (an empty field); an absent column is not read.
  let v = 0;
  if (p.accel_x && (v = c.accel_x[i] as number) === v) out.accelX = v;
  else out.accelX = undefined;
  if (p.accel_y && (v = c.accel_y[i] as number) === v) out.accelY = v;
  else out.accelY = undefined;
  if (p.accel_z && (v = c.accel_z[i] as number) === v) out.accelZ = v;
  else out.accelZ = undefined;
  if (p.stick_x && (v = c.stick_x[i] as number) === v) out.stickX = v;
  else out.stickX = undefined;
  if (p.stick_y && (v = c.stick_y[i] as number) === v) out.stickY = v;
  else out.stickY = undefined;
  if (p.buttons && (v = c.buttons[i] as number) === v) out.buttons = v;
  else out.buttons = undefined;
  if (p.screen_angle && (v = c.screen_angle[i] as number) === v) out.screenAngleDeg = v;
  else out.screenAngleDeg = undefined;
  if (p.pointer_dx && (v = c.pointer_dx[i] as number) === v) out.pointerDx = v;
  else out.pointerDx = undefined;
  if (p.pointer_dy && (v = c.pointer_dy[i] as number) === v) out.pointerDy = v;
  else out.pointerDy = undefined;
  if (p.pointer_x && (v = c.pointer_x[i] as number) === v) out.pointerX = v;
  else out.pointerX = undefined;
  if (p.pointer_y && (v = c.pointer_y[i] as number) === v) out.pointerY = v;
  else out.pointerY = undefined;
  if (p.selected && (v = c.selected[i] as number) === v) out.selected = v;
  else out.selected = undefined;
  return out;
}

export { formatSampleCsv } from "./csvFormat";
