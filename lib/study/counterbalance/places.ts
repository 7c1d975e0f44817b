import type { StudyDesign } from "../design";
import { betweenGroupCount } from "./betweenLevelsFor";
import { counterbalancingRows } from "./counterbalancingRows";

/** What the allocation needs to know about a participant who took a place. */
export interface PlaceHolder {
  slot: number;
  status: "invited" | "consented" | "in_progress" | "completed" | "withdrawn";
  releasedAt: Date | null;
  lastActivityAt: Date | null;
}

/**
 * Whether a participant still holds their counterbalancing place (holdsPlace): a completed one
 * always (unless the place was released before they finished); a started one while not released
 * and active within the study's inactivity time; a withdrawn one never. Common practice: replace
 * drop-outs so the completed sample stays balanced.
 * Cost: O(1). @throws never.
 * @example holdsPlace({ slot: 0, status: "in_progress", releasedAt: null, lastActivityAt: new Date(0) }, 3_600_001, 3_600_000) // false
 */
export function holdsPlace(p: PlaceHolder, nowMs: number, inactivityMs: number): boolean {
  if (p.releasedAt !== null || p.status === "withdrawn" || p.status === "invited") return false;
  if (p.status === "completed") return true;
  return p.lastActivityAt !== null && nowMs - p.lastActivityAt.getTime() <= inactivityMs;
}

/**
 * The first place nobody holds (firstFreeSlot): the smallest whole number ≥ 0 not taken. The next
 * participant takes it, so a place released by a drop-out is filled before new ones are opened.
 * Cost: O(n). @throws never. @example firstFreeSlot([0, 1, 3]) // 2
 */
export function firstFreeSlot(taken: Iterable<number>): number {
  const set = new Set(taken);
  let s = 0;
  while (set.has(s)) s++;
  return s;
}

/** One cell of the balance table: a counterbalancing row within a between-subject group. */
export interface PlaceCell {
  group: number;
  row: number;
  order: number[];
  /** Places of this cell among the planned participants. */
  planned: number;
  completed: number;
  inProgress: number;
  free: number;
}

/**
 * Rows filled, in progress and free (placeBalance), for the design page: slot s is row s mod rows
 * of group ⌊s / rows⌋ mod groups (as orderForParticipant and betweenLevelsFor assign them), the
 * planned participants spread over the cells in slot order. `free` never drops below zero (a cell
 * can hold more than planned when more participants are recruited).
 * Cost: O(rows × groups + holders). @throws as counterbalancingRows.
 * @example placeBalance(design4Rows, [{ slot: 0, state: "completed" }], 4)[0] // { group: 0, row: 0, planned: 1, completed: 1, inProgress: 0, free: 0, order: [0,1,3,2] }
 */
export function placeBalance(design: StudyDesign, holders: readonly { slot: number; state: "completed" | "in_progress" }[], planned: number): PlaceCell[] {
  const rows = counterbalancingRows(design);
  const groups = betweenGroupCount(design);
  const cycle = rows.length * groups;
  const cells: PlaceCell[] = [];
  for (let g = 0; g < groups; g++) {
    for (let r = 0; r < rows.length; r++) {
      const first = g * rows.length + r;
      const plannedHere = planned > first ? Math.floor((planned - 1 - first) / cycle) + 1 : 0;
      cells.push({ group: g, row: r, order: [...rows[r]!], planned: plannedHere, completed: 0, inProgress: 0, free: 0 });
    }
  }
  for (const h of holders) {
    const cell = cells[(h.slot % cycle)]!;
    if (h.state === "completed") cell.completed++;
    else cell.inProgress++;
  }
  for (const c of cells) c.free = Math.max(0, c.planned - c.completed - c.inProgress);
  return cells;
}
