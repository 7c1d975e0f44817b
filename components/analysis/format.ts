/** Number formatting for result tables: fixed decimals, "—" for undefined (NaN/null) values. */
export function fmt(value: number | null | undefined, digits = 2): string {
  return value === null || value === undefined || !Number.isFinite(value) ? "—" : value.toFixed(digits);
}

/** p-values as journals print them. */
export function fmtP(p: number | null | undefined): string {
  if (p === null || p === undefined || !Number.isFinite(p)) return "—";
  return p < 0.001 ? "< .001" : p.toFixed(3).replace(/^0/, "");
}

/** A fraction as a percentage; null stays null. */
export function pct(x: number | null | undefined): number | null {
  return x === null || x === undefined ? null : 100 * x;
}
