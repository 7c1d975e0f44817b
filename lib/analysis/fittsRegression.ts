import { leastSquaresLine } from "../stats/linearRegression";
import type { RegressionRow, SequenceSummary } from "./result";

/**
 * Fitts regression per condition, MT = a + b·x over the condition's A×W means pooled over
 * participants (interfaces.md "regression"; Soukoreff & MacKenzie 2004 §4), x the effective ID
 * ("ide") or the nominal one ("id"). Every sequence given is finite (the one rule drops the others
 * before); a condition with fewer than 2 A×W points or one x gives null with a note.
 *
 * Cost: O(s).
 * @throws never.
 * @example fittsRegression(result.sequences, ["motion-4"], "ide")[0] // {condition: "motion-4", intercept: 244.8…, slope: 124.7…, r2: 1, points: 2, note: null}
 */
export function fittsRegression(sequences: readonly SequenceSummary[], conditions: readonly string[], x: "ide" | "id"): RegressionRow[] {
  // One pass over the sequences: per condition, the A×W points in order of first appearance (the
  // order the sums and the line are computed in), found through amplitude → width maps.
  type Point = { x: number; mt: number; n: number };
  const byCondition = new Map<string, { points: Point[]; index: Map<number, Map<number, Point>> }>(conditions.map((c) => [c, { points: [], index: new Map() }]));
  for (const s of sequences) {
    const c = byCondition.get(s.condition);
    if (c === undefined) continue;
    let widths = c.index.get(s.amplitude);
    if (widths === undefined) c.index.set(s.amplitude, (widths = new Map()));
    let p = widths.get(s.width);
    if (p === undefined) {
      p = { x: 0, mt: 0, n: 0 };
      widths.set(s.width, p);
      c.points.push(p);
    }
    p.x += s[x];
    p.mt += s.mt;
    p.n++;
  }
  return conditions.map((condition) => {
    const ps = byCondition.get(condition)!.points;
    const line = leastSquaresLine(ps.map((p) => p.x / p.n), ps.map((p) => p.mt / p.n));
    return { condition, intercept: line.intercept, slope: line.slope, r2: line.r2, points: ps.length, note: line.note };
  });
}
