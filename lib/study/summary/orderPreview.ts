import { conditionsOf, type StudyDesign } from "../design";
import { counterbalancingRows } from "../counterbalance/counterbalancingRows";
import { betweenGroupCount } from "../counterbalance/betweenLevelsFor";
import { plannedRowsWarning } from "../counterbalance/plannedRowsWarning";

export type OrderPreview = { rows: number; participants: { participant: number; row: number; order: string[] }[]; warning: string | null };

/**
 * The condition order of participants 1..N (orderPreview), for the designer's preview table:
 * participant p (1-based) gets row (p − 1) mod rows (common practice), plus the warning when N
 * is not a multiple of the rows, or, with between-subject groups, of rows × groups (every group
 * takes every order: betweenLevelsFor).
 *
 * Cost: O(N · conditions).
 * @throws Error as counterbalancingRows (e.g. all orders with more than 4 conditions).
 * @example orderPreview(design2x2, 2).participants[1] // { participant: 2, row: 1, order: ["motion / gain 8", "stick / gain 4", "motion / gain 4", "stick / gain 8"] }
 */
export function orderPreview(design: StudyDesign, participants = design.plannedParticipants): OrderPreview {
  const labels = conditionsOf(design).map((c) => c.label);
  const rows = counterbalancingRows(design);
  return {
    rows: rows.length,
    participants: Array.from({ length: participants }, (_, i) => ({ participant: i + 1, row: i % rows.length, order: rows[i % rows.length]!.map((c) => labels[c]!) })),
    warning: plannedRowsWarning(participants, rows.length, betweenGroupCount(design)),
  };
}

