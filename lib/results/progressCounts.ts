/** Participant statuses, in the order a session goes through them. */
export const PARTICIPANT_STATUSES = ["invited", "consented", "in_progress", "completed", "withdrawn"] as const;
export type ParticipantStatus = (typeof PARTICIPANT_STATUSES)[number];

export interface ProgressCounts {
  byStatus: Record<ParticipantStatus, number>;
  /** One entry per counterbalancing row that has participants (null: not yet assigned). */
  byRow: { row: number | null; counts: Record<ParticipantStatus, number>; total: number }[];
  total: number;
}

const zero = (): Record<ParticipantStatus, number> => ({ invited: 0, consented: 0, in_progress: 0, completed: 0, withdrawn: 0 });

/**
 * Participants per status and per counterbalancing row (progressCounts), for the results page's
 * progress table. Rows sorted, unassigned last.
 * Cost: O(participants).
 * @throws never.
 * @example progressCounts([{ status: "completed", cbRow: 0 }]).byRow[0].counts.completed // 1
 */
export function progressCounts(participants: readonly { status: ParticipantStatus; cbRow: number | null }[]): ProgressCounts {
  const byStatus = zero();
  const rows = new Map<number | null, Record<ParticipantStatus, number>>();
  for (const p of participants) {
    byStatus[p.status]++;
    const r = rows.get(p.cbRow) ?? zero();
    r[p.status]++;
    rows.set(p.cbRow, r);
  }
  const byRow = [...rows.entries()]
    .sort(([a], [b]) => (a === null ? 1 : b === null ? -1 : a - b))
    .map(([row, counts]) => ({ row, counts, total: Object.values(counts).reduce((x, y) => x + y, 0) }));
  return { byStatus, byRow, total: participants.length };
}
