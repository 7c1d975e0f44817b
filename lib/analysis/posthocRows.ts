import { holm } from "../stats/holm";
import { pairedT } from "../stats/pairedT";
import { welchT } from "../stats/welchT";
import type { AnalysisDesign } from "./analysisDesign";
import type { BetweenPosthocRow, GroupPosthocRow, PosthocRow } from "./result";

/** Paired t tests of TP for every pair of conditions over the given participants (indices into design.complete). */
function pairs(design: AnalysisDesign, people: readonly number[]): PosthocRow[] {
  const rows: PosthocRow[] = [];
  const { conditions } = design;
  for (let i = 0; i < conditions.length; i++) {
    for (let j = i + 1; j < conditions.length; j++) {
      const a = people.map((p) => design.cell(p, i).tp);
      const b = people.map((p) => design.cell(p, j).tp);
      const r = pairedT(a, b);
      rows.push({ a: conditions[i]!, b: conditions[j]!, meanDiff: r.meanDiff, t: r.t, df: r.df, p: r.p, pHolm: null, dz: r.dz, note: r.note });
    }
  }
  return rows;
}

function applyHolm<R extends { p: number | null; pHolm: number | null }>(rows: R[]): R[] {
  holm(rows.map((r) => r.p)).forEach((p, i) => (rows[i]!.pHolm = p));
  return rows;
}

/**
 * Post hoc comparisons of TP (posthocRows), each family Holm-corrected on its own (Holm 1979; every
 * planned comparison counts in m, also one that cannot be computed):
 * - `posthoc`: every pair of conditions, paired t over all complete participants (the contract);
 * - `withinGroups` (mixed designs): the same pairs within each group of at least 2 participants;
 * - `betweenGroups` (mixed designs): in each condition, every pair of groups of at least 2
 *   participants, Welch's t (unequal variances; Welch 1947).
 *
 * Cost: O(c²·p + c·g²·p).
 * @throws never.
 * @example posthocRows(design).posthoc[0] // {a: "motion-4", b: "stick-4", meanDiff: 1.88…, t: 7.19…, df: 3, p: 0.0055…, pHolm: 0.0055…, dz: 3.59…, note: null}
 */
export function posthocRows(design: AnalysisDesign): { posthoc: PosthocRow[]; withinGroups?: GroupPosthocRow[]; betweenGroups?: BetweenPosthocRow[] } {
  const everyone = design.complete.map((_, i) => i);
  if (everyone.length < 2 || design.conditions.length < 2) return { posthoc: [] };
  const posthoc = applyHolm(pairs(design, everyone));
  if (design.between.length === 0) return { posthoc };
  const members = design.groupLabels.map((_, g) => everyone.filter((p) => design.groupOf[p] === g));
  const withinGroups: GroupPosthocRow[] = [];
  members.forEach((people, g) => {
    if (people.length >= 2) for (const r of pairs(design, people)) withinGroups.push({ group: design.groupLabels[g]!, ...r });
  });
  const betweenGroups: BetweenPosthocRow[] = [];
  design.conditions.forEach((condition, c) => {
    for (let g = 0; g < members.length; g++) {
      for (let h = g + 1; h < members.length; h++) {
        if (members[g]!.length < 2 || members[h]!.length < 2) continue;
        const r = welchT(members[g]!.map((p) => design.cell(p, c).tp), members[h]!.map((p) => design.cell(p, c).tp));
        betweenGroups.push({ condition, a: design.groupLabels[g]!, b: design.groupLabels[h]!, meanDiff: r.meanDiff, t: r.t, df: r.df, p: r.p, pHolm: null, d: r.d, note: r.note });
      }
    }
  });
  return { posthoc, withinGroups: applyHolm(withinGroups), betweenGroups: applyHolm(betweenGroups) };
}
