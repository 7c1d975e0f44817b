/**
 * Coarsened age band (coarsenAgeBand).
 *
 * Purpose: open data keeps age only in wide bands (18–29, 30–44, 45–64, 65+), fewer rare values
 * for the k-anonymity check. Reads a band ("25-34", "25–34", "65+") or a whole age ("31") by its lower
 * bound. Bands are our own choice; widening quasi-identifiers is the generalisation of Sweeney 2002.
 * Cost: O(1).
 * @throws never; "" for an empty or unreadable answer, "under 18" below 18.
 * @example coarsenAgeBand("25-34") // "18-29"
 */
export function coarsenAgeBand(answer: string | number | null | undefined): string {
  if (answer === null || answer === undefined) return "";
  const m = String(answer).match(/\d+/);
  if (!m) return "";
  const low = Number(m[0]);
  if (low < 18) return "under 18";
  if (low < 30) return "18-29";
  if (low < 45) return "30-44";
  if (low < 65) return "45-64";
  return "65+";
}

/**
 * Coarsened handedness (coarsenHandedness): "left", "right" or "mixed" (anything else, such as
 * "both" or "ambidextrous"); "" when unanswered.
 * Cost: O(1).
 * @throws never.
 * @example coarsenHandedness("Left-handed") // "left"
 */
export function coarsenHandedness(answer: string | number | null | undefined): string {
  if (answer === null || answer === undefined || String(answer).trim() === "") return "";
  const a = String(answer).toLowerCase();
  if (a.startsWith("left")) return "left";
  if (a.startsWith("right")) return "right";
  return "mixed";
}

/**
 * Coarsened experience with motion aiming (coarsenExperience): "none", "some" or "much". Reads a
 * number on a 1..7 (or 1..5) scale, or words ("never", "occasionally", "daily", ...).
 * Cost: O(1).
 * @throws never; "" when unanswered.
 * @example coarsenExperience(6) // "much"
 */
export function coarsenExperience(answer: string | number | null | undefined): string {
  if (answer === null || answer === undefined || String(answer).trim() === "") return "";
  const n = Number(answer);
  if (Number.isFinite(n)) return n <= 1 ? "none" : n <= 4 ? "some" : "much";
  const a = String(answer).toLowerCase();
  if (/^(none|never|no)/.test(a)) return "none";
  if (/(daily|often|weekly|much|expert|lot|frequent)/.test(a)) return "much";
  return "some";
}
