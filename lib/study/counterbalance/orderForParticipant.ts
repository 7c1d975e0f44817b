import type { StudyDesign } from "../design";
import { counterbalancingRows } from "./counterbalancingRows";

/**
 * A participant's condition order (orderForParticipant): participant i (0-based, in the order
 * they consent) gets row i mod rows of counterbalancingRows(design) (common practice: recruit in
 * multiples of the row count so every row is used equally often).
 *
 * Cost: that of counterbalancingRows (the rows are rebuilt on each call).
 * @throws Error when participantIndex is not a whole number ≥ 0, or as counterbalancingRows.
 * @example orderForParticipant(design2x2Williams, 5) // { row: 1, order: [1,2,0,3] }
 */
export function orderForParticipant(design: StudyDesign, participantIndex: number): { row: number; order: number[] } {
  if (!Number.isInteger(participantIndex) || participantIndex < 0) throw new Error(`orderForParticipant requires a whole-number participant index ≥ 0, got ${participantIndex}`);
  const rows = counterbalancingRows(design);
  const row = participantIndex % rows.length;
  return { row, order: [...rows[row]!] };
}
