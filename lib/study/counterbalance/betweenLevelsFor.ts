import type { StudyDesign } from "../design";
import { counterbalancingRows } from "./counterbalancingRows";

/** Number of between-subject groups: the product of the between factors' level counts (1 without any). */
export function betweenGroupCount(design: Pick<StudyDesign, "betweenFactors">): number {
  return design.betweenFactors.reduce((n, f) => n * f.levels.length, 1);
}

/**
 * The between-subject levels of participant i (betweenLevelsFor), 0-based in the order they
 * consent: the groups are the full crossing of the between factors (the last factor varies
 * fastest), and participant i joins group ⌊i / rows⌋ mod groups, where rows is the number of
 * counterbalancing rows. So the first `rows` participants fill every order in group 1, the next
 * `rows` in group 2, and so on: every group gets every within-subject order equally often and no
 * between factor's level goes with another's or with an order (a full factorial crossing with
 * counterbalancing inside each group, common practice).
 *
 * Cost: that of counterbalancingRows plus O(between factors).
 * @throws Error when participantIndex is not a whole number ≥ 0, or as counterbalancingRows.
 * @example betweenLevelsFor(designWith4RowsAndHand2Levels, 5) // { hand: "left" } (group 2 of 2)
 */
export function betweenLevelsFor(design: StudyDesign, participantIndex: number): Record<string, string> {
  if (!Number.isInteger(participantIndex) || participantIndex < 0) throw new Error(`betweenLevelsFor requires a whole-number participant index ≥ 0, got ${participantIndex}`);
  if (design.betweenFactors.length === 0) return {};
  const rows = counterbalancingRows(design).length;
  let group = Math.floor(participantIndex / rows) % betweenGroupCount(design);
  const picked: string[] = [];
  for (let k = design.betweenFactors.length - 1; k >= 0; k--) {
    const { levels } = design.betweenFactors[k]!;
    picked[k] = levels[group % levels.length]!;
    group = Math.floor(group / levels.length);
  }
  return Object.fromEntries(design.betweenFactors.map((f, k) => [f.name, picked[k]!]));
}
