import type { PlannedSequence } from "./plan";

/**
 * The idempotency key of one sequence upload (uploadKey).
 *
 * Purpose: unique per session and sequence, so a repeated upload is recognised and not stored
 * twice: `${participantId}:${p|m}:${block}:${conditionIndex}:${sequence}` (p = practice,
 * m = measured). Source: the project's upload contract. Cost: O(1).
 * @throws never.
 * @example uploadKey(12, { practice: false, block: 1, conditionIndex: 2, sequence: 3 }) // "12:m:1:2:3"
 */
export function uploadKey(participantId: number, s: Pick<PlannedSequence, "practice" | "block" | "conditionIndex" | "sequence">): string {
  return `${participantId}:${s.practice ? "p" : "m"}:${s.block}:${s.conditionIndex}:${s.sequence}`;
}
