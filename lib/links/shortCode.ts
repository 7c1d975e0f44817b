import { randomCode, UNAMBIGUOUS_ALPHABET } from "@/lib/recruitment/codes";

/** Characters of a short code: 8 from the unambiguous alphabet (31⁸ ≈ 8.5·10¹¹, about 39.6 bits). */
export const SHORT_CODE_LENGTH = 8;

/** What a short code looks like; anything else is refused before the database is asked. */
export const SHORT_CODE_PATTERN = new RegExp(`^[${UNAMBIGUOUS_ALPHABET}]{${SHORT_CODE_LENGTH}}$`);

/**
 * A new short code (newShortCode) for a link typed on a phone or read from a QR code: no 0/O or
 * 1/I/L to mistake, upper case only. Unguessable enough for a link that expires within hours; it
 * is never the only secret of anything that lasts (the link leads to a session token).
 * Cost: O(1). @throws never. @example newShortCode() // "K7QM2XHP"
 */
export function newShortCode(): string {
  return randomCode(SHORT_CODE_LENGTH);
}

/** A typed code, forgiving of case, spaces and dashes ("k7qm-2xhp" → "K7QM2XHP"); null when it cannot be one. */
export function normaliseShortCode(typed: string): string | null {
  const s = typed.replace(/[\s-]+/g, "").toUpperCase();
  return SHORT_CODE_PATTERN.test(s) ? s : null;
}
