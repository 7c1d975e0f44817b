import { mean } from "simple-statistics";
import { friedman, holm, leastSquaresLine, pairedT, rmAnova, tInterval, type WithinFactor } from "../stats";
import type { AnalysisResult, AnovaRow, CellSummary, ConditionSummary, MissingReport, PosthocRow, RegressionRow, SequenceSummary } from "./result";
import { codeCollator } from "./summarizeSequences";

type Measure = "tp" | "mt" | "errorRate";

/**
 * Mean of means per participant × condition (Soukoreff & MacKenzie 2004, IJHCS 61:751–789):
 * each cell averages the participant's sequence values in that condition.
 *
 * Cost: O(s).
 */
export function cellMeans(sequences: readonly SequenceSummary[]): CellSummary[] {
  const groups = new Map<string, SequenceSummary[]>();
  for (const s of sequences) {
    const key = `${s.participant}\u0000${s.condition}`;
    const g = groups.get(key);
    if (g) g.push(s);
    else groups.set(key, [s]);
  }
  return [...groups.values()]
    .map((g) => ({
      participant: g[0]!.participant,
      condition: g[0]!.condition,
      tp: mean(g.map((s) => s.tp)),
      mt: mean(g.map((s) => s.mt)),
      errorRate: mean(g.map((s) => s.errorRate)),
      we: mean(g.map((s) => s.we)),
      ide: mean(g.map((s) => s.ide)),
      sequences: g.length,
    }))
    .sort((a, b) => codeCollator.compare(a.participant, b.participant) || codeCollator.compare(a.condition, b.condition));
}

function fitts(sequences: readonly SequenceSummary[], conditions: readonly string[], x: "ide" | "id"): RegressionRow[] {
  return conditions.map((condition) => {
    const points = new Map<string, { x: number[]; mt: number[] }>();
    for (const s of sequences) {
      if (s.condition !== condition) continue;
      const key = `${s.amplitude}\u0000${s.width}`;
      const p = points.get(key) ?? { x: [], mt: [] };
      p.x.push(s[x]);
      p.mt.push(s.mt);
      points.set(key, p);
    }
    const xs = [...points.values()].map((p) => mean(p.x));
    const ys = [...points.values()].map((p) => mean(p.mt));
    const line = xs.length >= 2 && xs.every(Number.isFinite) ? leastSquaresLine(xs, ys) : { intercept: Number.NaN, slope: Number.NaN, r2: Number.NaN };
    return { condition, ...line, points: xs.length };
  });
}

function toAnovaRow(e: ReturnType<typeof rmAnova>[number]): AnovaRow {
  const { effect, df1, df2, F, p, epsilonGG, pGG, partialEta2, ...extra } = e;
  return { effect, df1, df2, F, p, epsilonGG, pGG, partialEta2, ...extra };
}

/**
 * Builds everything above the sequences: cells, condition summaries (mean, sample SD, 95 % t
 * interval over participants), Fitts regressions on IDe and on the nominal ID, the
 * repeated-measures ANOVA (one-way over conditions, and full factorial over the f_ factors), post
 * hoc paired t-tests with Holm correction, Friedman's test on error rates, and the missing-cell
 * report. Participants lacking a condition are left out of the inferential statistics.
 *
 * Cost: O(s + p·c²) plus the ANOVA's O(p·c³).
 */
export function aggregate(
  sequences: readonly SequenceSummary[],
  factorsByCondition: ReadonlyMap<string, Record<string, string>>,
  anovaMeasures: readonly Measure[],
): Pick<AnalysisResult, "cells" | "conditions" | "regression" | "anova" | "posthoc" | "regressionNominal" | "anovaMt" | "anovaErrorRate" | "friedman" | "missing" | "notes"> {
  const notes: string[] = [];
  const cells = cellMeans(sequences);
  const conditions = [...new Set(cells.map((c) => c.condition))].sort(codeCollator.compare);
  const participants = [...new Set(cells.map((c) => c.participant))].sort(codeCollator.compare);
  const cellOf = new Map(cells.map((c) => [`${c.participant}\u0000${c.condition}`, c]));

  const conditionSummaries: ConditionSummary[] = conditions.map((condition) => {
    const cs = cells.filter((c) => c.condition === condition);
    return {
      condition,
      n: cs.length,
      tp: tInterval(cs.map((c) => c.tp)),
      mt: tInterval(cs.map((c) => c.mt)),
      errorRate: tInterval(cs.map((c) => c.errorRate)),
      factors: factorsByCondition.get(condition) ?? {},
    };
  });

  const missingCells: MissingReport["cells"] = [];
  const complete = participants.filter((p) => {
    let ok = true;
    for (const condition of conditions) {
      if (!cellOf.has(`${p}\u0000${condition}`)) {
        missingCells.push({ participant: p, condition });
        ok = false;
      }
    }
    return ok;
  });
  const missing: MissingReport = { participantsExcluded: participants.length - complete.length, participantsIncluded: complete.length, cells: missingCells };
  if (missing.participantsExcluded > 0) {
    notes.push(`${missing.participantsExcluded} participant(s) lacking a condition were left out of the ANOVA, post hoc and Friedman tests`);
  }
  const matrix = (measure: Measure) => complete.map((p) => conditions.map((c) => cellOf.get(`${p}\u0000${c}`)![measure]));
  const canTest = complete.length >= 2 && conditions.length >= 2;
  if (!canTest) notes.push("inferential statistics need at least 2 complete participants and 2 conditions");

  const factorNames = [...new Set([...factorsByCondition.values()].flatMap((f) => Object.keys(f)))].sort();
  const anovaFor = (measure: Measure): AnovaRow[] => {
    if (!canTest) return [];
    const data = matrix(measure);
    if (data.some((r) => r.some((v) => !Number.isFinite(v)))) {
      notes.push(`ANOVA on ${measure} skipped: a cell value is not finite`);
      return [];
    }
    const rows = rmAnova(data, [{ name: "condition", levels: conditions.length }]).map(toAnovaRow);
    const factors: (WithinFactor & { values: string[] })[] = factorNames
      .map((name) => {
        const values = [...new Set(conditions.map((c) => factorsByCondition.get(c)?.[name] ?? ""))].sort(codeCollator.compare);
        return { name, levels: values.length, values };
      })
      .filter((f) => {
        if (f.levels < 2) notes.push(`factor ${f.name} has a single level and is not tested`);
        return f.levels >= 2;
      });
    if (factors.length === 0) return rows;
    const cellCount = factors.reduce((n, f) => n * f.levels, 1);
    const cellIndex = (condition: string) =>
      factors.reduce((idx, f) => idx * f.levels + f.values.indexOf(factorsByCondition.get(condition)?.[f.name] ?? ""), 0);
    const members = Array.from({ length: cellCount }, () => [] as number[]);
    conditions.forEach((c, j) => members[cellIndex(c)]!.push(j));
    if (members.some((m) => m.length === 0)) {
      notes.push(`factorial ANOVA on ${measure} skipped: not every combination of factor levels has a condition`);
      return rows;
    }
    const factorial = data.map((r) => members.map((m) => mean(m.map((j) => r[j]!))));
    return [...rows, ...rmAnova(factorial, factors).map(toAnovaRow)];
  };

  const anova = anovaFor("tp");
  const posthoc: PosthocRow[] = [];
  if (canTest) {
    const data = matrix("tp");
    for (let i = 0; i < conditions.length; i++) {
      for (let j = i + 1; j < conditions.length; j++) {
        const r = pairedT(data.map((row) => row[i]!), data.map((row) => row[j]!));
        posthoc.push({ a: conditions[i]!, b: conditions[j]!, meanDiff: r.meanDiff, t: r.t, df: r.df, p: r.p, pHolm: 0, dz: r.dz });
      }
    }
    holm(posthoc.map((r) => r.p)).forEach((p, i) => (posthoc[i]!.pHolm = p));
  }

  const result: ReturnType<typeof aggregate> = {
    cells,
    conditions: conditionSummaries,
    regression: fitts(sequences, conditions, "ide"),
    anova,
    posthoc,
    regressionNominal: fitts(sequences, conditions, "id"),
    friedman: canTest ? { measure: "errorRate", ...friedman(matrix("errorRate")) } : null,
    missing,
    notes,
  };
  if (anovaMeasures.includes("mt")) result.anovaMt = anovaFor("mt");
  if (anovaMeasures.includes("errorRate")) result.anovaErrorRate = anovaFor("errorRate");
  return result;
}
