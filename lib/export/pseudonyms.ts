import { createHmac, randomInt } from "node:crypto";

/**
 * Stable pseudonym from a keyed hash (stablePseudonym).
 *
 * Purpose: the same participant gets the same pseudonym in every archive of a study, yet nobody
 * without the study's secret can link it to the participant code or the database id. HMAC-SHA-256
 * (RFC 2104, FIPS 180-4) of the participant's database id under the study secret; the first 40 bits
 * as 10 hex digits, prefixed "s-".
 * Cost: O(1).
 * @throws Error "stablePseudonym requires a secret of at least 32 hex digits" for a short key.
 * @example stablePseudonym("00".repeat(32), 1) // "s-" followed by 10 hex digits
 */
export function stablePseudonym(secretHex: string, participantId: number): string {
  if (!/^[0-9a-f]{32,}$/i.test(secretHex)) throw new Error("stablePseudonym requires a secret of at least 32 hex digits");
  const mac = createHmac("sha256", Buffer.from(secretHex, "hex")).update(`participant:${participantId}`, "utf8").digest("hex");
  return `s-${mac.slice(0, 10)}`;
}

/**
 * Random pseudonyms for one archive (randomPseudonyms).
 *
 * Purpose: pseudonyms that link nothing across archives: a uniform random permutation
 * (Fisher–Yates, Knuth TAOCP vol. 2 §3.4.2, Algorithm P) of "r-01".."r-NN", drawn with the
 * operating system's cryptographic generator.
 * Cost: O(n).
 * @throws never.
 * @example randomPseudonyms([7, 9]) // Map { 7 => "r-02", 9 => "r-01" } (order varies)
 */
export function randomPseudonyms(participantIds: readonly number[]): Map<number, string> {
  const width = Math.max(2, String(participantIds.length).length);
  const labels = participantIds.map((_, i) => `r-${String(i + 1).padStart(width, "0")}`);
  for (let i = labels.length - 1; i > 0; i--) {
    const j = randomInt(i + 1);
    [labels[i], labels[j]] = [labels[j]!, labels[i]!];
  }
  return new Map(participantIds.map((id, i) => [id, labels[i]!]));
}
