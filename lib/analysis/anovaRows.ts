import { mixedAnova, type AnovaEffect, type AnovaFactor } from "../stats/mixedAnova";
import type { AnalysisDesign } from "./analysisDesign";

export type Measure = "tp" | "mt" | "errorRate";

/**
 * The ANOVA rows of one measure over the complete participants (anovaRows): first the one-way
 * `condition` effect (with the between factors, when there are any), then, with f_ factors, the
 * full factorial over the within factors (cells averaging their conditions) and the between
 * factors; without f_ factors the condition × between rows. Effects are named in the order of
 * their columns (condition first). A design that cannot be analysed gives no rows and a note.
 *
 * Cost: that of mixedAnova, twice.
 * @throws never: mixedAnova's errors become notes.
 * @example anovaRows(design, "tp", notes).map((r) => r.effect) // ["condition", "technique", "gain", "technique:gain"]
 */
export function anovaRows(design: AnalysisDesign, measure: Measure, notes: string[]): AnovaEffect[] {
  const { complete, conditions } = design;
  if (complete.length < 2 || conditions.length < 2) return [];
  const data = complete.map((_, p) => conditions.map((_, c) => design.cell(p, c)[measure]));
  const between: AnovaFactor[] = design.betweenTestable ? design.between : [];
  const groups = design.betweenTestable ? design.groupOf : undefined;
  const run = (values: number[][], within: AnovaFactor[]): AnovaEffect[] | null => {
    try {
      return mixedAnova({ values, within, between, groups, order: design.order });
    } catch (e) {
      notes.push(`ANOVA on ${measure} not computed: ${(e as Error).message}`);
      return null;
    }
  };
  const oneWay = run(data, [{ name: "condition", levels: conditions.length }]) ?? [];
  if (design.within.length === 0 || design.members === null) return oneWay;
  const members = design.members;
  const factorial = run(
    data.map((row) => members.map((m) => m.reduce((s, j) => s + row[j]!, 0) / m.length)),
    design.within,
  );
  return [...oneWay.filter((r) => r.effect === "condition"), ...(factorial ?? [])];
}
