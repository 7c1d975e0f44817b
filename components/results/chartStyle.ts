/**
 * Series styles that stay apart in grey-scale print: each condition gets a marker shape and a
 * dash pattern as well as a shade, so no plot relies on colour alone.
 */
export const SERIES = [
  { stroke: "#1e293b", fill: "#1e293b", shape: "circle", dash: "" },
  { stroke: "#0f766e", fill: "#ffffff", shape: "square", dash: "6 3" },
  { stroke: "#475569", fill: "#475569", shape: "triangle", dash: "2 2" },
  { stroke: "#92400e", fill: "#ffffff", shape: "diamond", dash: "8 3 2 3" },
  { stroke: "#334155", fill: "#334155", shape: "cross", dash: "1 3" },
  { stroke: "#0e7490", fill: "#ffffff", shape: "star", dash: "10 4" },
  { stroke: "#57534e", fill: "#57534e", shape: "wye", dash: "4 4" },
  { stroke: "#7c2d12", fill: "#ffffff", shape: "circle", dash: "12 2" },
] as const;

export const seriesStyle = (i: number) => SERIES[i % SERIES.length]!;

/** A number for a table cell: fixed digits, "–" for missing. */
export function fmt(x: number | null | undefined, digits = 2): string {
  return x === null || x === undefined || !Number.isFinite(x) ? "–" : x.toFixed(digits);
}

/** p values as journals print them. */
export function fmtP(p: number | null | undefined): string {
  if (p === null || p === undefined || !Number.isFinite(p)) return "–";
  return p < 0.001 ? "< .001" : p.toFixed(3).replace(/^0/, "");
}

/** A fraction as a percentage; null stays null. */
export function pct(x: number | null | undefined): number | null {
  return x === null || x === undefined ? null : 100 * x;
}
