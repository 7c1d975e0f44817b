/**
 * Holm's step-down correction of p values for m comparisons (Holm 1979, Scand. J. Statist.
 * 6:65–70): sort ascending, p̃(i) = max over j ≤ i of min(1, (m − j + 1)·p(j)). Returned in the
 * input's order. NaN inputs stay NaN and do not count towards m.
 *
 * Cost: O(m log m).
 * @throws never.
 * @example holm([0.01, 0.04, 0.03]) // [0.03, 0.06, 0.06]
 */
export function holm(pValues: readonly number[]): number[] {
  const indexed = pValues
    .map((p, i) => ({ p, i }))
    .filter((e) => !Number.isNaN(e.p))
    .sort((x, y) => x.p - y.p);
  const m = indexed.length;
  const out = pValues.map(() => Number.NaN);
  let running = 0;
  indexed.forEach((e, rank) => {
    running = Math.max(running, Math.min(1, (m - rank) * e.p));
    out[e.i] = running;
  });
  return out;
}
