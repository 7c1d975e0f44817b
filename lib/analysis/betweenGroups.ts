import { TrialTableError } from "../trials/trialTableError";
import type { ParticipantGroup } from "./trialAccumulator";

/**
 * Each participant's between-factor levels (b_ columns), checked as a design needs them: every
 * between factor has at least 2 levels, and no factor is both within (f_) and between (b_).
 * (A level changing within a participant and an empty level are caught while reading.)
 *
 * Cost: O(p·b).
 * @throws TrialTableError naming line 1 (the header) and the b_ column.
 * @example betweenGroups(accumulator.participants, ["technique"], "t.csv").get("P01") // {group: "novice"}
 */
export function betweenGroups(participants: ReadonlyMap<string, ParticipantGroup>, withinNames: readonly string[], file: string): Map<string, Readonly<Record<string, string>>> {
  const out = new Map<string, Readonly<Record<string, string>>>();
  const levels = new Map<string, Set<string>>();
  for (const [code, p] of participants) {
    out.set(code, p.groups);
    for (const [name, level] of Object.entries(p.groups)) {
      const set = levels.get(name) ?? new Set<string>();
      set.add(level);
      levels.set(name, set);
    }
  }
  for (const [name, set] of levels) {
    if (withinNames.includes(name)) throw new TrialTableError({ file, line: 1, column: `b_${name}` }, `factor ${name} is both a within-subject (f_${name}) and a between-subject factor`);
    if (set.size < 2) {
      throw new TrialTableError({ file, line: 1, column: `b_${name}` }, `between factor ${name} has a single level ("${[...set][0]}"); a between factor needs at least 2`);
    }
  }
  return out;
}
