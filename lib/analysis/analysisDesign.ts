import type { AnovaFactor } from "../stats/mixedAnova";
import type { CellSummary, MissingReport } from "./result";
import { codeCollator } from "./summarizeSequences";

/** A factor with its level labels in order. */
export interface NamedFactor extends AnovaFactor {
  values: string[];
}

/**
 * The structure the inferential statistics run on: the conditions, the participants with a value
 * in every condition (the others are left out of every test: the one rule), the within-subject
 * factorial (f_ factors with at least 2 levels, each combination mapped to its conditions) and the
 * between-subject groups (b_ factors) of the complete participants.
 */
export interface AnalysisDesign {
  conditions: string[];
  /** Participants with a cell in every condition, in code order. */
  complete: string[];
  missing: MissingReport;
  /** value(participant index in `complete`, condition index, measure). */
  cell: (p: number, c: number) => CellSummary;
  within: NamedFactor[];
  /** For each factorial cell (row-major over `within`), the condition indices it averages; null when the factorial cannot run. */
  members: number[][] | null;
  between: NamedFactor[];
  /** Group index (row-major over `between`) of each complete participant. */
  groupOf: number[];
  /** Group labels (levels joined by " / ") by group index. */
  groupLabels: string[];
  /** Each group's levels by between factor, by group index. */
  groupLevels: Record<string, string>[];
  /** Whether the between factors can enter the ANOVA (every group has a complete participant, N > groups). */
  betweenTestable: boolean;
  /** Factor names in the order effect names list them: condition first, then the table's column order. */
  order: string[];
  notes: string[];
}

/**
 * Builds the AnalysisDesign from the cells (analysisDesign). `factorsOf` gives each condition's f_
 * levels, `groupsOf` each participant's b_ levels, `order` the factor names in column order.
 *
 * Cost: O(p·c + c·f).
 * @throws never.
 * @example analysisDesign(cells, factorsOf, groupsOf, ["technique", "gain"]).complete.length // 12
 */
export function analysisDesign(
  cells: readonly CellSummary[],
  factorsOf: ReadonlyMap<string, Readonly<Record<string, string>>>,
  groupsOf: ReadonlyMap<string, Readonly<Record<string, string>>>,
  order: readonly string[],
): AnalysisDesign {
  const notes: string[] = [];
  const conditions = [...new Set(cells.map((c) => c.condition))].sort(codeCollator.compare);
  const participants = [...new Set(cells.map((c) => c.participant))].sort(codeCollator.compare);
  const cellOf = new Map(cells.map((c) => [`${c.participant}\u0000${c.condition}`, c]));
  const missingCells: MissingReport["cells"] = [];
  const left: MissingReport["participants"] = [];
  const complete = participants.filter((p) => {
    const lacking = conditions.filter((c) => !cellOf.has(`${p}\u0000${c}`));
    for (const condition of lacking) missingCells.push({ participant: p, condition });
    if (lacking.length > 0) left.push({ participant: p, reason: `no value in ${lacking.length === 1 ? "condition" : "conditions"} ${lacking.join(", ")}` });
    return lacking.length === 0;
  });
  if (left.length > 0) notes.push(`${left.length} participant(s) without a value in every condition were left out of every test (ANOVAs, post hoc, Friedman): ${left.map((l) => l.participant).join(", ")}`);
  const missing: MissingReport = { participantsExcluded: left.length, participantsIncluded: complete.length, cells: missingCells, participants: left };

  const levelsOf = (names: string[], of: (name: string) => string[]): NamedFactor[] =>
    names.map((name) => {
      const values = [...new Set(of(name))].sort(codeCollator.compare);
      return { name, levels: values.length, values };
    });
  const withinNames = [...new Set([...factorsOf.values()].flatMap((f) => Object.keys(f)))];
  const allWithin = levelsOf(withinNames, (name) => conditions.map((c) => factorsOf.get(c)?.[name] ?? ""));
  const within = allWithin.filter((f) => {
    if (f.levels < 2) notes.push(`factor ${f.name} has a single level and is not tested`);
    return f.levels >= 2;
  });
  let members: number[][] | null = null;
  if (within.length > 0) {
    const count = within.reduce((n, f) => n * f.levels, 1);
    const m = Array.from({ length: count }, () => [] as number[]);
    conditions.forEach((c, j) => {
      const idx = within.reduce((i, f) => i * f.levels + f.values.indexOf(factorsOf.get(c)?.[f.name] ?? ""), 0);
      m[idx]!.push(j);
    });
    if (m.some((x) => x.length === 0)) notes.push("the factorial ANOVA is not computed: not every combination of factor levels has a condition");
    else members = m;
  }

  const betweenNames = [...new Set(complete.flatMap((p) => Object.keys(groupsOf.get(p) ?? {})))];
  const between = levelsOf(betweenNames, (name) => complete.map((p) => groupsOf.get(p)?.[name] ?? ""));
  const groupOf = complete.map((p) => between.reduce((i, f) => i * f.levels + f.values.indexOf(groupsOf.get(p)?.[f.name] ?? ""), 0));
  const groupCount = between.reduce((n, f) => n * f.levels, 1);
  const groupLevels = Array.from({ length: groupCount }, (_, g) => {
    const levels: Record<string, string> = {};
    let rest = g;
    for (let i = between.length - 1; i >= 0; i--) {
      levels[between[i]!.name] = between[i]!.values[rest % between[i]!.levels]!;
      rest = Math.floor(rest / between[i]!.levels);
    }
    return levels;
  });
  const groupLabels = groupLevels.map((levels) => between.map((f) => levels[f.name]!).join(" / "));
  let betweenTestable = between.length > 0;
  if (betweenTestable) {
    const counts = new Array<number>(groupCount).fill(0);
    for (const g of groupOf) counts[g]!++;
    const empty = counts.map((c, g) => (c === 0 ? groupLabels[g]! : null)).filter((x): x is string => x !== null);
    if (between.some((f) => f.levels < 2)) {
      betweenTestable = false;
      notes.push("the between factors are not tested: among the complete participants a between factor has a single level");
    } else if (empty.length > 0) {
      betweenTestable = false;
      notes.push(`the between factors are not tested: no complete participant in group${empty.length === 1 ? "" : "s"} ${empty.join(", ")}`);
    } else if (complete.length <= groupCount) {
      betweenTestable = false;
      notes.push(`the between factors are not tested: ${complete.length} complete participants in ${groupCount} groups leave no error degrees of freedom`);
    }
  }
  const rank = (name: string) => {
    const i = order.indexOf(name);
    return i === -1 ? order.length : i;
  };
  const names = ["condition", ...[...within, ...between].map((f) => f.name).sort((a, b) => rank(a) - rank(b))];
  return {
    conditions,
    complete,
    missing,
    cell: (p, c) => cellOf.get(`${complete[p]}\u0000${conditions[c]}`)!,
    within,
    members,
    between,
    groupOf,
    groupLabels,
    groupLevels,
    betweenTestable,
    order: names,
    notes,
  };
}
