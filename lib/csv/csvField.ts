/**
 * First characters that make a spreadsheet read a cell as a formula: = + - @, tab and carriage
 * return (OWASP, "CSV Injection"; ASVS 4.0 requirement 5.3.10 names the same set).
 */
export const FORMULA_TRIGGERS: readonly string[] = ["=", "+", "-", "@", "\t", "\r"];

/**
 * One CSV field (csvField), safe to open in a spreadsheet.
 *
 * Purpose: every CSV the product writes goes through here. Text is quoted when it holds a comma,
 * a quote, a line break or leading/trailing space, quotes doubled (RFC 4180 §2.6–2.7); text that
 * begins with a formula trigger is neutralised as OWASP's CSV Injection guidance says: a single
 * quote in front, the whole field quoted, so `=HYPERLINK(…)` stays text. Numbers are written as
 * numbers (JavaScript's shortest round-trip form; a negative number is data, not a formula);
 * null, undefined and non-finite numbers are empty; booleans 1/0.
 * Cost: O(length).
 * @throws never.
 * @example csvField("=HYPERLINK(\"http://x.example\")") // "\"'=HYPERLINK(\"\"http://x.example\"\")\""
 */
export function csvField(value: string | number | boolean | null | undefined): string {
  if (value === null || value === undefined) return "";
  if (typeof value === "number") return Number.isFinite(value) ? String(value) : "";
  if (typeof value === "boolean") return value ? "1" : "0";
  if (value.length > 0 && FORMULA_TRIGGERS.includes(value[0]!)) return `"'${value.replace(/"/g, '""')}"`;
  return /[",\r\n]/.test(value) || value !== value.trim() ? `"${value.replace(/"/g, '""')}"` : value;
}

/**
 * One CSV record (csvLine): fields through csvField, joined by commas. No line break is added.
 * Cost: O(length).
 * @throws never.
 * @example csvLine(["a,b", 1.5, null, "-x"]) // "\"a,b\",1.5,,\"'-x\""
 */
export function csvLine(fields: readonly (string | number | boolean | null | undefined)[]): string {
  return fields.map(csvField).join(",");
}
