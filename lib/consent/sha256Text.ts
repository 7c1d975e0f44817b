import { createHash } from "node:crypto";

/**
 * SHA-256 of a text's exact UTF-8 bytes, lower-case hex (sha256Text): the fingerprint a frozen
 * consent version carries, so a participant's record names exactly the words they saw.
 *
 * Source: FIPS 180-4 (Secure Hash Standard), computed with node:crypto. Cost: O(length).
 * @throws never.
 * @example sha256Text("abc") // "ba7816bf8f01cfea414140de5dae2223b00361a396177a9cb410ff61f20015ad"
 */
export function sha256Text(text: string): string {
  return createHash("sha256").update(text, "utf8").digest("hex");
}
