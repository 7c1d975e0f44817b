import type { AnalysisResult, AnovaRow } from "../../lib/analysis";

type Num = number | null | undefined;
const f = (v: Num, digits = 2) => (v !== null && v !== undefined && Number.isFinite(v) ? v.toFixed(digits) : "–");
const pv = (v: Num) => (v !== null && v !== undefined && Number.isFinite(v) ? (v < 0.001 ? "<.001" : v.toFixed(3)) : "–");
const pct = (v: Num, digits = 1) => f(v === null || v === undefined ? v : 100 * v, digits);

function table(title: string, header: string[], rows: string[][]): string {
  if (rows.length === 0) return `${title}\n  (none)\n`;
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
  const line = (cells: string[]) => "  " + cells.map((c, i) => (i === 0 ? c.padEnd(widths[i]!) : c.padStart(widths[i]!))).join("  ");
  return [title, line(header), "  " + widths.map((w) => "-".repeat(w)).join("  "), ...rows.map(line)].join("\n") + "\n";
}

function anovaTable(title: string, rows: readonly AnovaRow[]): string {
  const out = table(
    title,
    ["effect", "df1", "df2", "F", "p", "ε GG", "p GG", "ε HF", "p HF", "η²p", "η²G", "Mauchly W", "p"],
    rows.map((a) => [a.effect, String(a.df1), String(a.df2), f(a.F), pv(a.p), f(a.epsilonGG, 3), pv(a.pGG), f(a.epsilonHF, 3), pv(a.pHF), f(a.partialEta2, 3), f(a.generalizedEta2, 3), f(a.mauchly?.W, 3), pv(a.mauchly?.p)]),
  );
  const notes = rows.filter((a) => a.note).map((a) => `  ${a.effect}: ${a.note}${a.pLowerBound !== null ? ` (p lower bound ${pv(a.pLowerBound)})` : ""}\n`);
  return out + notes.join("");
}

/** Readable plain-text tables of an analysis result (what `analyze` prints without --json). */
export function formatReport(r: AnalysisResult, file: string): string {
  const out: string[] = [];
  const e = r.exclusions;
  out.push(
    `${file}: ${r.movements} movements, ${r.sequences.length} sequences, ${r.cells.length} participant × condition cells; ` +
      `start ${r.start}, geometry ${r.geometry}, unit ${r.unit}, width ${r.widthMethod}\n` +
      `exclude ${r.exclude}: ${r.excluded} removed (misfire ${e.misfire}, mt3sd ${e.mt3sd}, timed_out ${e.timed_out}, recentered ${e.recentered}, clutched ${e.clutched}); ${r.timeoutsKept} time-out(s) kept as errors\n`,
  );
  out.push(
    table(
      "Conditions (mean of participant means; SD; 95 % t interval)",
      ["condition", "n", "TP bits/s", "SD", "95 % CI", "MT ms", "SD", "error %", "SD"],
      r.conditions.map((c) => [c.condition, String(c.n), f(c.tp.mean), f(c.tp.sd), `[${f(c.tp.ci95[0])}, ${f(c.tp.ci95[1])}]`, f(c.mt.mean, 0), f(c.mt.sd, 0), pct(c.errorRate.mean), pct(c.errorRate.sd)]),
    ),
  );
  if (r.conditionsByGroup) {
    out.push(
      table(
        `Conditions by group (${r.groups?.factors.join(" × ")})`,
        ["group", "condition", "n", "TP bits/s", "SD", "MT ms", "error %"],
        r.conditionsByGroup.map((c) => [c.group, c.condition, String(c.n), f(c.tp.mean), f(c.tp.sd), f(c.mt.mean, 0), pct(c.errorRate.mean)]),
      ),
    );
  }
  if (r.conditions.some((c) => c.path)) {
    out.push(
      table(
        `Path accuracy (mean of participant means; MV, ME, MO in ${r.unit})`,
        ["condition", "movements", "TRE", "TAC", "MDC", "ODC", "MV", "ME", "MO"],
        r.conditions.filter((c) => c.path).map((c) => [c.condition, String(c.path!.movements), f(c.path!.tre), f(c.path!.tac), f(c.path!.mdc), f(c.path!.odc), f(c.path!.mv), f(c.path!.me), f(c.path!.mo)]),
      ),
    );
  }
  out.push(
    table(
      "Fitts regression MT = a + b·IDe (A×W means)",
      ["condition", "a ms", "b ms/bit", "r²", "points", "b on ID", "r² on ID"],
      r.regression.map((g, i) => [g.condition, f(g.intercept, 0), f(g.slope, 1), f(g.r2, 3), String(g.points), f(r.regressionNominal[i]?.slope, 1), f(r.regressionNominal[i]?.r2, 3)]),
    ),
  );
  out.push(anovaTable(`ANOVA on TP (${r.missing.participantsIncluded} participants; ${r.missing.participantsExcluded} left out for missing cells)`, r.anova));
  for (const [name, rows] of [["MT", r.anovaMt], ["error rate", r.anovaErrorRate]] as const) {
    if (rows) out.push(anovaTable(`ANOVA on ${name}`, rows));
  }
  out.push(
    table(
      "Post hoc paired t-tests on TP (Holm)",
      ["pair", "diff", "t", "df", "p", "p Holm", "d_z"],
      r.posthoc.map((h) => [`${h.a} – ${h.b}`, f(h.meanDiff, 3), f(h.t), String(h.df), pv(h.p), pv(h.pHolm), f(h.dz)]),
    ),
  );
  if (r.posthocWithinGroups) {
    out.push(
      table(
        "Post hoc paired t-tests on TP within each group (Holm over all of them)",
        ["group", "pair", "diff", "t", "df", "p", "p Holm", "d_z"],
        r.posthocWithinGroups.map((h) => [h.group, `${h.a} – ${h.b}`, f(h.meanDiff, 3), f(h.t), String(h.df), pv(h.p), pv(h.pHolm), f(h.dz)]),
      ),
    );
  }
  if (r.posthocBetweenGroups) {
    out.push(
      table(
        "Groups compared in each condition on TP: Welch's t (Holm over all of them)",
        ["condition", "groups", "diff", "t", "df", "p", "p Holm", "d"],
        r.posthocBetweenGroups.map((h) => [h.condition, `${h.a} – ${h.b}`, f(h.meanDiff, 3), f(h.t), f(h.df, 1), pv(h.p), pv(h.pHolm), f(h.d)]),
      ),
    );
  }
  if (r.friedman) out.push(`Friedman test on error rate: χ²(${r.friedman.df}) = ${f(r.friedman.statistic)}, p = ${pv(r.friedman.p)}, n = ${r.friedman.n}${r.friedman.note ? ` (${r.friedman.note})` : ""}\n`);
  for (const d of r.sequencesDropped) out.push(`left out: sequence ${d.sequence} of ${d.participant} in ${d.condition}, block ${d.block}: ${d.reason}\n`);
  for (const note of r.notes) out.push(`note: ${note}\n`);
  out.push(`rule: ${r.rule}\n`);
  return out.join("\n");
}
