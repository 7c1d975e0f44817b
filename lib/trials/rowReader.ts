import { BETWEEN_PREFIX, COORDINATE_COLUMNS, FACTOR_PREFIX, FLAG_COLUMNS, INTEGER_COLUMNS, LEGACY_TRIAL_COLUMNS, TRIAL_COLUMNS } from "./columns";
import type { LegacyTrialRow, Located, TrialRow } from "./trialRow";
import { decimalRange } from "./decimalValue";
import { fieldEquals, fieldText, type RecordFields } from "./recordFields";
import { TrialTableError } from "./trialTableError";

/** Distinct factor-level combinations remembered per reader (a table has a few dozen). */
const FACTOR_CACHE_LIMIT = 4096;

/** Converts one CSV record (its fields as ranges of a text) to a row, or throws TrialTableError. */
export type RowReader<R> = (fields: RecordFields, line: number) => Located<R>;

/**
 * Builds the record → row converter for a header: checks the required columns once, then converts
 * each record by column index. The checks are the same as trialRowSchema's (zod) but written out,
 * since running zod per row costs about 0.9 s per million rows on the project machine (measured),
 * a third of the analysis budget; a property test checks both agree. Numbers go through
 * decimalRange in the line's text, without a string per field (same doubles as Number()); the
 * participant and condition codes are strings shared with the previous row when they repeat; rows
 * with the same raw factor fields share one frozen
 * `factors` object, and likewise `groups` (the b_NAME between-factor levels, only with b_ columns).
 * The optional flag columns timed_out, recentered and clutched (0/1) become booleans when all three are present.
 *
 * Cost: O(columns) to build; O(columns) per row.
 * @throws TrialTableError on a missing or duplicate column.
 */
export function makeRowReader(header: readonly string[], file: string, legacy: false): RowReader<TrialRow>;
export function makeRowReader(header: readonly string[], file: string, legacy: true): RowReader<LegacyTrialRow>;
export function makeRowReader(header: readonly string[], file: string, legacy: boolean): RowReader<TrialRow | LegacyTrialRow> {
  const index = new Map<string, number>();
  header.forEach((name, i) => {
    const key = name.trim();
    if (index.has(key)) throw new TrialTableError({ file, line: 1, column: key }, `duplicate column "${key}"`);
    index.set(key, i);
  });
  const required: readonly string[] = legacy ? LEGACY_TRIAL_COLUMNS : TRIAL_COLUMNS;
  for (const column of required) {
    if (!index.has(column)) throw new TrialTableError({ file, line: 1, column }, `missing column "${column}"`);
  }
  const at = (c: string) => index.get(c)!;
  const iParticipant = at("participant");
  const iCondition = at("condition");
  const integers = INTEGER_COLUMNS.map((c) => at(c));
  const iAmplitude = at("amplitude");
  const iWidth = at("width");
  const iTime = at("time_ms");
  const iHit = at("hit");
  const coords = legacy ? [] : COORDINATE_COLUMNS.map((c) => at(c));
  const prefixed = (prefix: string) =>
    header
      .map((name, i) => ({ name: name.trim(), i }))
      .filter((h) => h.name.startsWith(prefix) && h.name.length > prefix.length)
      .map((h) => ({ factor: h.name.slice(prefix.length), i: h.i }));
  const factorColumns = prefixed(FACTOR_PREFIX);
  const betweenColumns = prefixed(BETWEEN_PREFIX);
  // The movement flags are read only when all three columns are there (interfaces.md: optional).
  const flagAt = FLAG_COLUMNS.every((c) => index.has(c)) ? FLAG_COLUMNS.map((c) => at(c)) : [-1, -1, -1];
  const [iTimedOut, iRecentered, iClutched] = flagAt as [number, number, number];

  const fail = (line: number, i: number, message: string): never => {
    throw new TrialTableError({ file, line, column: header[i]!.trim() }, message);
  };
  /** Levels of f_ or b_ columns as one frozen object per distinct raw text (the previous row's fields checked first). */
  const levelReader = (columns: { factor: string; i: number }[], empty: string) => {
    const cache = new Map<string, Record<string, string>>();
    const lastFields: string[] = columns.map(() => "");
    let last: Readonly<Record<string, string>> | undefined;
    return (fields: RecordFields, line: number): Readonly<Record<string, string>> => {
      let same = last !== undefined;
      for (let k = 0; same && k < columns.length; k++) same = fieldEquals(fields, columns[k]!.i, lastFields[k]!);
      if (same) return last!;
      let key = "";
      for (let k = 0; k < columns.length; k++) key += fieldText(fields, columns[k]!.i) + "\u0000";
      let cached = cache.get(key);
      if (cached === undefined) {
        const built: Record<string, string> = {};
        for (const f of columns) {
          const v = fieldText(fields, f.i);
          if (v.length === 0) fail(line, f.i, empty);
          built[f.factor] = v;
        }
        cached = Object.freeze(built);
        if (cache.size < FACTOR_CACHE_LIMIT) cache.set(key, cached);
      }
      for (let k = 0; k < columns.length; k++) lastFields[k] = fieldText(fields, columns[k]!.i);
      last = cached;
      return cached;
    };
  };
  const readFactors = levelReader(factorColumns, "empty text, expected a code");
  const readGroups = betweenColumns.length > 0 ? levelReader(betweenColumns, "empty: the participant is in no group of this between factor") : undefined;
  /** The field's text trimmed, as "0" or "1" without making a string when it is one character. */
  const bit = (fields: RecordFields, i: number): string => {
    const a = fields.start[i]!;
    if (fields.end[i]! - a === 1) {
      const c = fields.text.charCodeAt(a);
      if (c === 48) return "0";
      if (c === 49) return "1";
    }
    return fieldText(fields, i).trim();
  };
  const flag = (fields: RecordFields, line: number, i: number): boolean | undefined => {
    if (i < 0) return undefined;
    const t = bit(fields, i);
    if (t === "1") return true;
    if (t === "0") return false;
    return fail(line, i, `must be 0 or 1, got "${fieldText(fields, i)}"`);
  };

  /** A code column: the previous row's string when the field repeats it. */
  const codeReader = () => {
    let last = "";
    return (fields: RecordFields, line: number, i: number): string => {
      if (last.length > 0 && fieldEquals(fields, i, last)) return last;
      const v = fieldText(fields, i);
      if (v.length === 0) fail(line, i, "empty text, expected a code");
      last = v;
      return v;
    };
  };
  const participantCode = codeReader();
  const conditionCode = codeReader();
  const num = (fields: RecordFields, line: number, i: number): number => {
    const v = decimalRange(fields.text, fields.start[i]!, fields.end[i]!);
    if (!Number.isFinite(v) || (v === 0 && fieldText(fields, i).trim().length === 0)) fail(line, i, `not a number: "${fieldText(fields, i)}"`);
    return v;
  };
  const int = (fields: RecordFields, line: number, i: number): number => {
    const v = num(fields, line, i);
    if (!Number.isInteger(v)) fail(line, i, `not an integer: "${fieldText(fields, i)}"`);
    return v;
  };

  return (fields, line) => {
    const amplitude = num(fields, line, iAmplitude);
    if (!(amplitude > 0)) fail(line, iAmplitude, `amplitude must be > 0, got ${amplitude}`);
    const width = num(fields, line, iWidth);
    if (!(width > 0)) fail(line, iWidth, `width must be > 0, got ${width}`);
    const timeMs = num(fields, line, iTime);
    if (timeMs < 0) fail(line, iTime, `time_ms must be ≥ 0, got ${timeMs}`);
    const hitText = bit(fields, iHit);
    if (hitText !== "0" && hitText !== "1") fail(line, iHit, `hit must be 0 or 1, got "${fieldText(fields, iHit)}"`);
    const trial = int(fields, line, integers[2]!);
    if (trial < 1) fail(line, integers[2]!, `trial must be ≥ 1, got ${trial}`);
    // Rows of a sequence repeat their factor levels: one frozen object per distinct raw text.
    const factors = readFactors(fields, line);
    const groups = readGroups === undefined ? undefined : readGroups(fields, line);
    const timedOut = flag(fields, line, iTimedOut);
    const recentered = flag(fields, line, iRecentered);
    const clutched = flag(fields, line, iClutched);
    const participant = participantCode(fields, line, iParticipant);
    const condition = conditionCode(fields, line, iCondition);
    const block = int(fields, line, integers[0]!);
    const sequence = int(fields, line, integers[1]!);
    const hit = hitText === "1";
    // Explicit literals, no object spread: spreading here cost ~30 µs per row in V8 (measured).
    if (legacy) return { participant, condition, block, sequence, trial, amplitude, width, timeMs, hit, factors, groups, timedOut, recentered, clutched, line };
    return {
      participant,
      condition,
      block,
      sequence,
      trial,
      amplitude,
      width,
      timeMs,
      hit,
      factors,
      groups,
      timedOut,
      recentered,
      clutched,
      line,
      fromX: num(fields, line, coords[0]!),
      fromY: num(fields, line, coords[1]!),
      toX: num(fields, line, coords[2]!),
      toY: num(fields, line, coords[3]!),
      startX: num(fields, line, coords[4]!),
      startY: num(fields, line, coords[5]!),
      endX: num(fields, line, coords[6]!),
      endY: num(fields, line, coords[7]!),
    };
  };
}
