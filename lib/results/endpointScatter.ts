import { isMisfire } from "../analysis/isMisfire";
import { projectMovement } from "../analysis/projectMovement";
import type { SequenceSummary } from "../analysis/result";
import type { TrialRow } from "../trials/trialRow";

/** A condition's end points in target widths, on the task axis (x along, y across). */
export interface EndpointCloud {
  condition: string;
  points: { x: number; y: number; hit: boolean }[];
  /** Mean We/W over the condition's sequences: the effective-width band is ±half of it. */
  weOverW: number | null;
  /** Kept movements in the condition (points may be a thinned sample of them). */
  movements: number;
}

/** Misfires among the removed movements, by reason (one movement may meet both). */
export interface MisfireReasons {
  /** Distance along the task axis below A/2. */
  short: number;
  /** Selection more than 2W from the target centre. */
  far: number;
  /** Movements removed by any rule (misfire, MT outlier, flag). */
  removed: number;
}

/**
 * End points normalised to the task axis (endpointScatter), and the misfires among the removed
 * movements by reason.
 *
 * Purpose: the end-point plot of each condition. For each movement S = the previous selection
 * point, T = the target centre, P = the selection: x = dx/W along the axis (+ overshoot), y = the
 * perpendicular part /W (science.md §1, ISO 9241-411; on the view sphere the great-circle angles,
 * see taskAxis). `keep` (one byte per row, in the same order) says which movements the analysis
 * kept; without it the common-practice misfire rule decides. Removed movements are counted, not
 * plotted. At most `maxPoints` per condition, thinned evenly.
 * Cost: O(movements).
 * @throws Error from projectMovement when a movement starts on its target centre.
 * @example endpointScatter(rows, sequences).clouds[0].weOverW // 1.04
 */
export function endpointScatter(
  rows: Iterable<TrialRow>,
  sequences: readonly SequenceSummary[],
  options: { keep?: Uint8Array; geometry?: "plane" | "sphere"; maxPoints?: number } = {},
): { clouds: EndpointCloud[]; exclusions: MisfireReasons } {
  const maxPoints = options.maxPoints ?? 1500;
  const all = new Map<string, { x: number; y: number; hit: boolean }[]>();
  const exclusions: MisfireReasons = { short: 0, far: 0, removed: 0 };
  let i = -1;
  for (const r of rows) {
    i++;
    const m = projectMovement(r.startX, r.startY, r.toX, r.toY, r.endX, r.endY, options.geometry ?? "plane");
    const misfire = isMisfire(m.distance, m.endError, r.amplitude, r.width);
    const removed = options.keep ? options.keep[i] === 0 : misfire;
    if (removed) {
      exclusions.removed++;
      if (m.distance < r.amplitude / 2) exclusions.short++;
      if (m.endError > 2 * r.width) exclusions.far++;
      continue;
    }
    const list = all.get(r.condition) ?? [];
    list.push({ x: m.dx / r.width, y: m.across / r.width, hit: r.hit && !r.timedOut });
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
    return { condition, points: points.filter((_, k) => k % step === 0), weOverW: r ? r.sum / r.n : null, movements: points.length };
  });
  return { clouds, exclusions };
}
