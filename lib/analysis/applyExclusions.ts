import type { FlagColumn } from "../trials/columns";
import { FLAG_COLUMNS } from "../trials/columns";
import { isMisfire } from "./isMisfire";
import { FLAG_BITS, FLAG_TIMED_OUT, type MovementStore } from "./movementStore";
import type { ExclusionRule } from "./options";
import type { SequenceInfo } from "./sequenceInfo";

/** Movements removed, by the rule that removed them (each movement counted once, under the first rule it met). */
export interface ExclusionCounts {
  /** Flagged movements removed because the flag was chosen for removal. */
  timed_out: number;
  recentered: number;
  clutched: number;
  /** Misfires: distance along the axis < A/2, or |P − T| > 2W (common practice). */
  misfire: number;
  /** Movement times beyond the mean ± 3 SD of the participant × condition (common practice). */
  mt3sd: number;
}

export interface ExclusionOutcome {
  /** 1 for a movement kept, 0 for one removed. */
  keep: Uint8Array;
  counts: ExclusionCounts;
  /** Time-outs kept (they count as errors). */
  timeoutsKept: number;
}

/**
 * Applies the exclusion rules to every movement (applyExclusions), in this order:
 * 1. flagged movements whose flag is in `dropFlagged` (timed_out, recentered, clutched);
 * 2. misfires (rules "misfire" and "misfire+mt3sd"): distance along the axis < A/2 or the selection
 *    more than 2W from the target centre (common practice; science.md §1);
 * 3. MT outliers (rules "mt3sd" and "misfire+mt3sd"): a movement time further than 3 sample SDs from
 *    the mean of the participant × condition's remaining movements (common practice), one pass.
 * A time-out that is not removed by step 1 stays in as an error and is exempt from steps 2 and 3 (and
 * from the mean and SD of step 3): removing it as a misfire or outlier would hide the error. Legacy
 * tables (no coordinates) skip step 2.
 *
 * Cost: O(movements).
 * @throws never.
 * @example applyExclusions(store, sequences, "misfire", [], false).counts // {timed_out: 0, recentered: 0, clutched: 0, misfire: 3, mt3sd: 0}
 */
export function applyExclusions(
  store: MovementStore,
  sequences: readonly SequenceInfo[],
  rule: ExclusionRule,
  dropFlagged: readonly FlagColumn[],
  legacy: boolean,
): ExclusionOutcome {
  const n = store.length;
  const keep = new Uint8Array(n).fill(1);
  const counts: ExclusionCounts = { timed_out: 0, recentered: 0, clutched: 0, misfire: 0, mt3sd: 0 };
  const dropMask = dropFlagged.reduce((m, f) => m | FLAG_BITS[FLAG_COLUMNS.indexOf(f)]!, 0);
  const misfires = !legacy && (rule === "misfire" || rule === "misfire+mt3sd");
  const outliers = rule === "mt3sd" || rule === "misfire+mt3sd";
  const { seq, flags, distance, endError } = store;
  let timeoutsKept = 0;
  for (let i = 0; i < n; i++) {
    const f = flags[i]!;
    if ((f & dropMask) !== 0) {
      keep[i] = 0;
      for (let k = 0; k < FLAG_COLUMNS.length; k++) {
        if ((f & dropMask & FLAG_BITS[k]!) !== 0) {
          counts[FLAG_COLUMNS[k]!]++;
          break;
        }
      }
      continue;
    }
    if ((f & FLAG_TIMED_OUT) !== 0) {
      timeoutsKept++;
      continue;
    }
    if (misfires) {
      const s = sequences[seq[i]!]!;
      if (isMisfire(distance[i]!, endError[i]!, s.amplitude, s.width)) {
        keep[i] = 0;
        counts.misfire++;
      }
    }
  }
  if (outliers) counts.mt3sd = removeTimeOutliers(store, sequences, keep);
  return { keep, counts, timeoutsKept };
}

/** Step 3: per participant × condition mean and sample SD of the kept, not timed-out times; removes those beyond ±3 SD. */
function removeTimeOutliers(store: MovementStore, sequences: readonly SequenceInfo[], keep: Uint8Array): number {
  const cellOf = new Int32Array(sequences.length);
  const cells = new Map<string, number>();
  sequences.forEach((s, i) => {
    const key = `${s.participant}\u0000${s.condition}`;
    let c = cells.get(key);
    if (c === undefined) {
      c = cells.size;
      cells.set(key, c);
    }
    cellOf[i] = c;
  });
  const count = new Float64Array(cells.size);
  const sum = new Float64Array(cells.size);
  const { seq, timeMs, flags } = store;
  const candidate = (i: number) => keep[i] === 1 && (flags[i]! & FLAG_TIMED_OUT) === 0;
  for (let i = 0; i < store.length; i++) {
    if (!candidate(i)) continue;
    const c = cellOf[seq[i]!]!;
    count[c]!++;
    sum[c]! += timeMs[i]!;
  }
  const mean = sum.map((s, c) => s / count[c]!);
  const ss = new Float64Array(cells.size);
  for (let i = 0; i < store.length; i++) {
    if (!candidate(i)) continue;
    const c = cellOf[seq[i]!]!;
    ss[c]! += (timeMs[i]! - mean[c]!) ** 2;
  }
  const sd = ss.map((v, c) => (count[c]! > 1 ? Math.sqrt(v / (count[c]! - 1)) : Number.POSITIVE_INFINITY));
  let removed = 0;
  for (let i = 0; i < store.length; i++) {
    if (!candidate(i)) continue;
    const c = cellOf[seq[i]!]!;
    if (Math.abs(timeMs[i]! - mean[c]!) > 3 * sd[c]!) {
      keep[i] = 0;
      removed++;
    }
  }
  return removed;
}
