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

/**
 * The working copy (design, consent, information, invitation text) may change in these states:
 * after approval a change is an amendment that needs its own review; never while a submission waits
 * for a decision (service/protocol.ts editLock also checks an amendment in review).
 */
export const EDITABLE_STATUSES: readonly StudyStatus[] = ["draft", "approved", "recruiting"];
