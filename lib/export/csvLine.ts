/**
 * One CSV record (csvLine): fields joined by commas, quoted when they hold a comma, a quote, a
 * line break or leading/trailing space, quotes doubled (RFC 4180 §2). null/undefined and NaN are
 * empty fields; numbers use JavaScript's shortest round-trip form. No line break is added.
 * Cost: O(length).
 * @throws never.
 * @example csvLine(["a,b", 1.5, null]) // "\"a,b\",1.5,"
 */
export function csvLine(fields: readonly (string | number | boolean | null | undefined)[]): string {
  return fields
    .map((f) => {
      if (f === null || f === undefined) return "";
      if (typeof f === "number") return Number.isFinite(f) ? String(f) : "";
      if (typeof f === "boolean") return f ? "1" : "0";
      return /[",\r\n]/.test(f) || f !== f.trim() ? `"${f.replace(/"/g, '""')}"` : f;
    })
    .join(",");
}
