import type { StudyStatus } from "@/lib/data/studies";

/** The study life cycle: draft → in_review → approved → recruiting → closed; a return goes back to draft. */
export const STATUS_FLOW: Record<StudyStatus, StudyStatus[]> = {
  draft: ["in_review"],
  in_review: ["approved", "draft"],
  approved: ["recruiting", "draft"],
  recruiting: ["closed"],
  closed: [],
};

/** Whether a study may move from one status to another (canTransition). Cost: O(1). @example canTransition("draft", "approved") // false */
export function canTransition(from: StudyStatus, to: StudyStatus): boolean {
  return STATUS_FLOW[from].includes(to);
}

/** Design and consent may change only in these states (a change after approval sends the study back to draft). */
export const EDITABLE_STATUSES: readonly StudyStatus[] = ["draft", "approved"];
