import { csvField as quote } from "../csv/csvField";
import { BETWEEN_PREFIX, FACTOR_PREFIX, FLAG_COLUMNS, TRIAL_COLUMNS } from "./columns";
import type { TrialRow } from "./trialRow";

/** Optional columns: the movement flags after hit, and b_NAME for each between factor after the f_NAME ones. */
export interface TrialCsvExtras {
  /** Write timed_out, recentered, clutched (a row without a flag writes 0). */
  flags?: boolean;
  between?: readonly string[];
}

/** `true` is short for { flags: true }. */
const extrasOf = (e: boolean | TrialCsvExtras): TrialCsvExtras => (typeof e === "boolean" ? { flags: e } : e);

/**
 * The header line of a trial table with the given factor names (f_NAME columns, in that order);
 * with `flags`, the optional movement flag columns (timed_out, recentered, clutched) after hit;
 * with `between`, a b_NAME column for each between factor after the f_NAME ones.
 */
export function trialCsvHeader(factorNames: readonly string[], extras: boolean | TrialCsvExtras = {}): string {
  const e = extrasOf(extras);
  return [...TRIAL_COLUMNS, ...(e.flags ? FLAG_COLUMNS : []), ...factorNames.map((f) => FACTOR_PREFIX + f), ...(e.between ?? []).map((b) => BETWEEN_PREFIX + b)]
    .map(quote)
    .join(",");
}

const flagCell = (v: boolean | undefined): string => (v ? "1" : "0");

/**
 * Formats one movement as a trial-table CSV line (no line break), columns in TRIAL_COLUMNS order,
 * with `flags` the movement flags (a row without them writes 0), then f_NAME for each factor name
 * given, then b_NAME for each between factor given. Numbers use JavaScript's shortest round-trip
 * form; text through csvField (a cell that begins with = + - @, tab or CR is neutralised with a
 * leading single quote, OWASP CSV Injection).
 *
 * Cost: O(columns).
 * @throws Error when the row lacks a level for one of the factor or between-factor names.
 * @example formatTrialRow(row, ["technique"]) // "P01,motion-6,1,1,1,256,32,0,-128,0,128,1.5,-126,2,130,612.5,1,motion"
 */
export function formatTrialRow(row: TrialRow, factorNames: readonly string[], extras: boolean | TrialCsvExtras = {}): string {
  const e = extrasOf(extras);
  const factorValues = factorNames.map((f) => {
    const v = row.factors[f];
    if (v === undefined) throw new Error(`formatTrialRow requires a level for factor ${f}`);
    return quote(v);
  });
  const betweenValues = (e.between ?? []).map((b) => {
    const v = row.groups?.[b];
    if (v === undefined) throw new Error(`formatTrialRow requires a level for between factor ${b}`);
    return quote(v);
  });
  return [
    quote(row.participant),
    quote(row.condition),
    row.block,
    row.sequence,
    row.trial,
    row.amplitude,
    row.width,
    row.fromX,
    row.fromY,
    row.toX,
    row.toY,
    row.startX,
    row.startY,
    row.endX,
    row.endY,
    row.timeMs,
    row.hit ? 1 : 0,
    ...(e.flags ? [flagCell(row.timedOut), flagCell(row.recentered), flagCell(row.clutched)] : []),
    ...factorValues,
    ...betweenValues,
  ].join(",");
}

/**
 * A whole trial table as CSV text (header, one line per movement, "\n" line ends, final newline).
 * The factor and between-factor columns are the union of the rows' names, sorted; the flag columns
 * are written when any row has a flag field.
 *
 * Cost: O(rows × columns).
 * @throws Error as formatTrialRow when a row lacks a factor another row has.
 */
export function toTrialCsv(rows: readonly TrialRow[]): string {
  const names = [...new Set(rows.flatMap((r) => Object.keys(r.factors)))].sort();
  const between = [...new Set(rows.flatMap((r) => Object.keys(r.groups ?? {})))].sort();
  const flags = rows.some((r) => r.timedOut !== undefined || r.recentered !== undefined || r.clutched !== undefined);
  const extras = { flags, between };
  return [trialCsvHeader(names, extras), ...rows.map((r) => formatTrialRow(r, names, extras))].join("\n") + "\n";
}
