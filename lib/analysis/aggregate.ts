import { friedman } from "../stats/friedman";
import { tInterval } from "../stats/tInterval";
import { analysisDesign } from "./analysisDesign";
import { anovaRows, type Measure } from "./anovaRows";
import { cellMeans, meanOfPaths } from "./cellMeans";
import { fittsRegression } from "./fittsRegression";
import { posthocRows } from "./posthocRows";
import type { AnalysisResult, CellSummary, ConditionSummary, GroupConditionSummary, GroupReport, SequenceSummary } from "./result";

/** The one rule for values that cannot be computed, as the output states it. */
export const MISSING_VALUE_RULE =
  "A value that cannot be computed is null, never a number, and is never averaged: a sequence whose IDe, MT or TP is not finite is left out of every summary (cells, conditions, regressions, plots) and listed in sequencesDropped with its reason; a participant without a value in every condition is left out of every test (ANOVAs, post hoc tests, Friedman) and listed in missing; a statistic that still cannot be computed is null with the reason in its note; Holm's correction counts every planned comparison.";

type Aggregated = Pick<
  AnalysisResult,
  "cells" | "conditions" | "regression" | "anova" | "posthoc" | "regressionNominal" | "anovaMt" | "anovaErrorRate" | "friedman" | "missing" | "notes" | "groups" | "conditionsByGroup" | "posthocWithinGroups" | "posthocBetweenGroups" | "rule"
>;

function summarise(cells: readonly CellSummary[]) {
  return { n: cells.length, tp: tInterval(cells.map((c) => c.tp)), mt: tInterval(cells.map((c) => c.mt)), errorRate: tInterval(cells.map((c) => c.errorRate)) };
}

/**
 * Builds everything above the sequences (aggregate): cells (mean of means), condition summaries
 * (mean, sample SD, 95 % t interval over participants, path means), Fitts regressions on IDe and on
 * the nominal ID, the ANOVA of TP (and of MT and error rate when asked) over the within factors
 * (f_) and the between factors (b_), post hoc tests (paired, within groups, Welch between groups,
 * Holm), Friedman's test on error rates, groups, and the report of who was left out. The sequences
 * given are all finite (summarizeSequences dropped the others): see MISSING_VALUE_RULE.
 *
 * Cost: O(s log s + p·c²) plus the ANOVAs.
 * @throws never.
 */
export function aggregate(
  sequences: readonly SequenceSummary[],
  factorsByCondition: ReadonlyMap<string, Readonly<Record<string, string>>>,
  groupsByParticipant: ReadonlyMap<string, Readonly<Record<string, string>>>,
  order: readonly string[],
  anovaMeasures: readonly Measure[],
): Aggregated {
  const cells = cellMeans(sequences, groupsByParticipant);
  const design = analysisDesign(cells, factorsByCondition, groupsByParticipant, order);
  const notes = [...design.notes];
  const { conditions } = design;

  const conditionSummaries: ConditionSummary[] = conditions.map((condition) => {
    const cs = cells.filter((c) => c.condition === condition);
    const summary: ConditionSummary = { condition, ...summarise(cs), factors: { ...(factorsByCondition.get(condition) ?? {}) } };
    const withPath = cs.filter((c) => c.path !== undefined);
    if (withPath.length > 0) summary.path = { ...meanOfPaths(withPath.map((c) => c.path!)), participants: withPath.length };
    return summary;
  });
  if (design.complete.length < 2 || conditions.length < 2) notes.push("the tests need at least 2 complete participants and 2 conditions");

  const anova = anovaRows(design, "tp", notes);
  const { posthoc, withinGroups, betweenGroups } = posthocRows(design);
  let friedmanResult: Aggregated["friedman"] = null;
  if (design.complete.length >= 2 && conditions.length >= 2) {
    const f = friedman(design.complete.map((_, p) => conditions.map((_, c) => design.cell(p, c).errorRate)));
    friedmanResult = { measure: "errorRate", ...f, note: f.statistic === null ? "every participant's error rates are tied across conditions: the statistic cannot be computed" : null };
  }

  const result: Aggregated = {
    cells,
    conditions: conditionSummaries,
    regression: fittsRegression(sequences, conditions, "ide"),
    anova,
    posthoc,
    regressionNominal: fittsRegression(sequences, conditions, "id"),
    friedman: friedmanResult,
    missing: design.missing,
    groups: null,
    rule: MISSING_VALUE_RULE,
    notes,
  };
  if (anovaMeasures.includes("mt")) result.anovaMt = anovaRows(design, "mt", notes);
  if (anovaMeasures.includes("errorRate")) result.anovaErrorRate = anovaRows(design, "errorRate", notes);
  if (design.between.length > 0) {
    const labelOf = (groups: Readonly<Record<string, string>> | undefined) => design.between.map((f) => groups?.[f.name] ?? "").join(" / ");
    const everyone = [...new Set(cells.map((c) => c.participant))];
    const report: GroupReport = {
      factors: design.between.map((f) => f.name),
      groups: design.groupLabels.map((group, g) => {
        return {
          group,
          groups: design.groupLevels[g]!,
          participants: everyone.filter((p) => labelOf(groupsByParticipant.get(p)) === group).length,
          complete: design.groupOf.filter((x) => x === g).length,
        };
      }),
    };
    result.groups = report;
    const byGroup: GroupConditionSummary[] = [];
    for (const g of report.groups) {
      for (const condition of conditions) {
        const cs = cells.filter((c) => c.condition === condition && labelOf(c.groups) === g.group);
        if (cs.length > 0) byGroup.push({ groups: g.groups, group: g.group, condition, ...summarise(cs) });
      }
    }
    result.conditionsByGroup = byGroup;
    if (withinGroups) result.posthocWithinGroups = withinGroups;
    if (betweenGroups) result.posthocBetweenGroups = betweenGroups;
  }
  return result;
}
