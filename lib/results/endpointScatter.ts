import { isMisfire } from "../analysis/isMisfire";
import { projectMovement } from "../analysis/projectMovement";
import type { SequenceSummary } from "../analysis/result";
import type { TrialRow } from "../trials/trialRow";

/** A condition's end points in target widths, on the task axis (x along, y across). */
export interface EndpointCloud {
  condition: string;
  points: { x: number; y: number; hit: boolean }[];
  /** Mean We/W over the condition's sequences: the effective-width band is ±half of it. */
  weOverW: number;
  /** Kept movements in the condition (points may be a thinned sample of them). */
  movements: number;
}

/** What the exclusion rule removed, by reason (one movement may meet both). */
export interface ExclusionCounts {
  /** Distance along the task axis below A/2. */
  short: number;
  /** Selection more than 2W from the target centre. */
  far: number;
  removed: number;
}

/**
 * End points normalised to the task axis (endpointScatter), and the misfire counts by reason.
 *
 * Purpose: the end-point plot of each condition. For each movement S = the previous selection
 * point, T = the target centre, P = the selection: x = (P − T)·u/W along u = (T − S)/|T − S|
 * (+ overshoot), y = the perpendicular part /W (science.md §1, ISO 9241-411). Misfires (the
 * common-practice rule of isMisfire) are counted, not plotted. At most `maxPoints` per condition,
 * thinned evenly.
 * Cost: O(movements).
 * @throws Error from projectMovement when a movement starts on its target centre.
 * @example endpointScatter(rows, sequences).clouds[0].weOverW // 1.04
 */
export function endpointScatter(rows: Iterable<TrialRow>, sequences: readonly SequenceSummary[], maxPoints = 1500): { clouds: EndpointCloud[]; exclusions: ExclusionCounts } {
  const all = new Map<string, { x: number; y: number; hit: boolean }[]>();
  const exclusions: ExclusionCounts = { short: 0, far: 0, removed: 0 };
  for (const r of rows) {
    const m = projectMovement(r.startX, r.startY, r.toX, r.toY, r.endX, r.endY);
    if (isMisfire(m.distance, m.endError, r.amplitude, r.width)) {
      exclusions.removed++;
      if (m.distance < r.amplitude / 2) exclusions.short++;
      if (m.endError > 2 * r.width) exclusions.far++;
      continue;
    }
    const ux = (r.toX - r.startX) / m.a, uy = (r.toY - r.startY) / m.a;
    const ex = r.endX - r.toX, ey = r.endY - r.toY;
    const list = all.get(r.condition) ?? [];
    list.push({ x: m.dx / r.width, y: (ux * ey - uy * ex) / r.width, hit: r.hit });
    all.set(r.condition, list);
  }
  const ratio = new Map<string, { sum: number; n: number }>();
  for (const s of sequences) {
    if (!Number.isFinite(s.we)) continue;
    const g = ratio.get(s.condition) ?? { sum: 0, n: 0 };
    g.sum += s.we / s.width;
    g.n++;
    ratio.set(s.condition, g);
  }
  const clouds = [...all.entries()].map(([condition, points]) => {
    const step = Math.max(1, Math.ceil(points.length / maxPoints));
    const r = ratio.get(condition);
    return { condition, points: points.filter((_, i) => i % step === 0), weOverW: r ? r.sum / r.n : NaN, movements: points.length };
  });
  return { clouds, exclusions };
}
