import { randomInt } from "node:crypto";

/** Letters and digits that cannot be mistaken for one another when read aloud or copied (no 0/O, 1/I/L). */
export const UNAMBIGUOUS_ALPHABET = "23456789ABCDEFGHJKMNPQRSTUVWXYZ";

/** `length` characters drawn uniformly from UNAMBIGUOUS_ALPHABET with node:crypto randomInt. Cost: O(length). */
export function randomCode(length: number): string {
  let s = "";
  for (let i = 0; i < length; i++) s += UNAMBIGUOUS_ALPHABET[randomInt(UNAMBIGUOUS_ALPHABET.length)]!;
  return s;
}

/**
 * A new pseudonymous participant code (newParticipantCode): "P-" and 6 unambiguous characters
 * (31⁶ ≈ 8.9·10⁸ codes); uniqueness per study is enforced by the database and a retry.
 * Cost: O(1). @throws never. @example newParticipantCode() // "P-7KQ2MX"
 */
export function newParticipantCode(): string {
  return `P-${randomCode(6)}`;
}

/**
 * A new completion code (newCompletionCode): 10 unambiguous characters in two groups
 * (31¹⁰ ≈ 8·10¹⁴), shown at the end of a session for the participant to paste into a panel.
 * Cost: O(1). @throws never. @example newCompletionCode() // "H4TW9-QC2NB"
 */
export function newCompletionCode(): string {
  return `${randomCode(5)}-${randomCode(5)}`;
}

export const PARTICIPANT_CODE_PATTERN = /^P-[23456789ABCDEFGHJKMNPQRSTUVWXYZ]{6}$/;
