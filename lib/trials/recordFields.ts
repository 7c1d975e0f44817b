/**
 * One CSV record's fields as ranges of a text (RecordFields): field i is
 * `text.slice(start[i], end[i])`. The trial-table reader converts numbers in place (decimalRange)
 * and makes strings only of the fields it keeps as text, instead of one string per field; the
 * plain splitter fills one RecordFields per line of its chunk, reused from line to line (read a
 * record before the next one arrives, never keep it).
 */
export interface RecordFields {
  text: string;
  start: Int32Array;
  end: Int32Array;
  count: number;
}

/** An empty record with room for `capacity` fields (grown by recordFromStrings and the splitter). */
export function emptyRecord(capacity = 32): RecordFields {
  return { text: "", start: new Int32Array(capacity), end: new Int32Array(capacity), count: 0 };
}

/** Room for at least `n` fields, keeping the first `count`. */
export function ensureCapacity(r: RecordFields, n: number): void {
  if (n <= r.start.length) return;
  const size = Math.max(n, r.start.length * 2);
  const start = new Int32Array(size);
  const end = new Int32Array(size);
  start.set(r.start.subarray(0, r.count));
  end.set(r.end.subarray(0, r.count));
  r.start = start;
  r.end = end;
}

/**
 * Fills `into` with the given field strings (as csv-parse yields them), joined into one text.
 * Cost: O(total length).
 * @example fieldText(recordFromStrings(["a", "bc"]), 1) // "bc"
 */
export function recordFromStrings(fields: readonly string[], into: RecordFields = emptyRecord(fields.length)): RecordFields {
  ensureCapacity(into, fields.length);
  let at = 0;
  for (let i = 0; i < fields.length; i++) {
    into.start[i] = at;
    at += fields[i]!.length;
    into.end[i] = at;
  }
  into.text = fields.join("");
  into.count = fields.length;
  return into;
}

/** Field i as a string. */
export function fieldText(r: RecordFields, i: number): string {
  return r.text.slice(r.start[i], r.end[i]);
}

/** Every field as a string (the header, an error message). */
export function recordStrings(r: RecordFields): string[] {
  return Array.from({ length: r.count }, (_, i) => fieldText(r, i));
}

/** Whether field i is exactly `s`, without making a string of it. */
export function fieldEquals(r: RecordFields, i: number, s: string): boolean {
  const a = r.start[i]!;
  return r.end[i]! - a === s.length && r.text.startsWith(s, a);
}
