/**
 * Holm's step-down correction of p values for m comparisons (Holm 1979, Scand. J. Statist.
 * 6:65–70): sort ascending, p̃(i) = max over j ≤ i of min(1, (m − j + 1)·p(j)). Returned in the
 * input's order. A comparison that could not be computed (null) still counts towards m, the number
 * of comparisons planned, and stays null: leaving it out would make the others less conservative.
 * (R's p.adjust(p, "holm") drops NA from m unless given n = length(p).)
 *
 * Cost: O(m log m).
 * @throws never.
 * @example holm([0.01, 0.04, null]) // [0.03, 0.08, null]
 */
export function holm(pValues: readonly (number | null)[]): (number | null)[] {
  const m = pValues.length;
  const computed = pValues
    .map((p, i) => ({ p, i }))
    .filter((e): e is { p: number; i: number } => e.p !== null && Number.isFinite(e.p))
    .sort((x, y) => x.p - y.p);
  const out: (number | null)[] = pValues.map(() => null);
  let running = 0;
  computed.forEach((e, rank) => {
    running = Math.max(running, Math.min(1, (m - rank) * e.p));
    out[e.i] = running;
  });
  return out;
}
