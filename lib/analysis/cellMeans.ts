import { PATH_KEYS } from "./pathAccuracy";
import type { CellSummary, PathSummary, SequenceSummary } from "./result";
import { codeCollator } from "./summarizeSequences";

/**
 * Mean of means per participant × condition (Soukoreff & MacKenzie 2004, IJHCS 61:751–789):
 * each cell averages the participant's sequence values in that condition (and their path means,
 * over the sequences that have them). `groupsOf` adds each participant's between-factor levels.
 *
 * Cost: O(s log s).
 * @throws never.
 * @example cellMeans(result.sequences)[0] // {participant: "P01", condition: "motion-4", tp: 4.25…, …, sequences: 2}
 */
export function cellMeans(sequences: readonly SequenceSummary[], groupsOf?: ReadonlyMap<string, Readonly<Record<string, string>>>): CellSummary[] {
  const byCell = new Map<string, SequenceSummary[]>();
  for (const s of sequences) {
    const key = `${s.participant}\u0000${s.condition}`;
    const g = byCell.get(key);
    if (g) g.push(s);
    else byCell.set(key, [s]);
  }
  const avg = (g: readonly SequenceSummary[], k: "tp" | "mt" | "errorRate" | "we" | "ide") => g.reduce((sum, s) => sum + s[k], 0) / g.length;
  return [...byCell.values()]
    .map((g) => {
      const first = g[0]!;
      const cell: CellSummary = {
        participant: first.participant,
        condition: first.condition,
        tp: avg(g, "tp"),
        mt: avg(g, "mt"),
        errorRate: avg(g, "errorRate"),
        we: avg(g, "we"),
        ide: avg(g, "ide"),
        sequences: g.length,
      };
      const groups = groupsOf?.get(first.participant);
      if (groups) cell.groups = { ...groups };
      const withPath = g.filter((s) => s.path !== undefined);
      if (withPath.length > 0) cell.path = meanOfPaths(withPath.map((s) => s.path!));
      return cell;
    })
    .sort((a, b) => codeCollator.compare(a.participant, b.participant) || codeCollator.compare(a.condition, b.condition));
}

/** Unweighted mean of path summaries (mean of means); `movements` adds up. */
export function meanOfPaths(paths: readonly PathSummary[]): PathSummary {
  const out: PathSummary = { tre: 0, tac: 0, mdc: 0, odc: 0, mv: 0, me: 0, mo: 0, movements: 0 };
  for (const p of paths) {
    for (const k of PATH_KEYS) out[k] += p[k] / paths.length;
    out.movements += p.movements;
  }
  return out;
}
