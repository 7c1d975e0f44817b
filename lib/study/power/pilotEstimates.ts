/** Smallest difference and spread as a pilot shows them. */
export interface PilotEstimate {
  /** Mean over people of last-level minus first-level throughput, bits/s. */
  difference: number;
  /** Sample SD over people of that difference, bits/s (includes the pilot's own measurement noise). */
  spread: number;
  people: number;
}

/**
 * Difference and spread from pilot cells (pilotEstimates): each person's mean throughput over the
 * conditions at the factor's first level and at its last level; the mean and the sample SD
 * (n − 1) of their differences. People without both levels are left out.
 * Source: the paired design's own quantities (Cohen 1988, §2.3.5: d_z = mean / SD of differences).
 * Cost: O(cells).
 * @throws Error "pilotEstimates needs at least 2 people with both levels".
 * @example pilotEstimates([{participant:"a",condition:"x",tp:3},{participant:"a",condition:"y",tp:3.5},{participant:"b",condition:"x",tp:2},{participant:"b",condition:"y",tp:3}], {x:"lo",y:"hi"}, "lo", "hi") // { difference: 0.75, spread: 0.3536, people: 2 }
 */
export function pilotEstimates(cells: readonly { participant: string; condition: string; tp: number }[], levelOfCondition: Readonly<Record<string, string>>, firstLevel: string, lastLevel: string): PilotEstimate {
  const by = new Map<string, { first: number[]; last: number[] }>();
  for (const c of cells) {
    if (!Number.isFinite(c.tp)) continue;
    const level = levelOfCondition[c.condition];
    if (level !== firstLevel && level !== lastLevel) continue;
    const e = by.get(c.participant) ?? { first: [], last: [] };
    (level === firstLevel ? e.first : e.last).push(c.tp);
    by.set(c.participant, e);
  }
  const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
  const diffs = [...by.values()].filter((e) => e.first.length && e.last.length).map((e) => mean(e.last) - mean(e.first));
  if (diffs.length < 2) throw new Error("pilotEstimates needs at least 2 people with both levels");
  const m = mean(diffs);
  const sd = Math.sqrt(diffs.reduce((s, d) => s + (d - m) ** 2, 0) / (diffs.length - 1));
  return { difference: m, spread: sd, people: diffs.length };
}
