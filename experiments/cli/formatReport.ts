import type { AnalysisResult } from "../../lib/analysis";

const f = (v: number, digits = 2) => (Number.isFinite(v) ? v.toFixed(digits) : "–");
const pv = (v: number) => (Number.isFinite(v) ? (v < 0.001 ? "<.001" : v.toFixed(3)) : "–");

function table(title: string, header: string[], rows: string[][]): string {
  if (rows.length === 0) return `${title}\n  (none)\n`;
  const widths = header.map((h, i) => Math.max(h.length, ...rows.map((r) => r[i]!.length)));
  const line = (cells: string[]) => "  " + cells.map((c, i) => (i === 0 ? c.padEnd(widths[i]!) : c.padStart(widths[i]!))).join("  ");
  return [title, line(header), "  " + widths.map((w) => "-".repeat(w)).join("  "), ...rows.map(line)].join("\n") + "\n";
}

/** Readable plain-text tables of an analysis result (what `analyze` prints without --json). */
export function formatReport(r: AnalysisResult, file: string): string {
  const out: string[] = [];
  out.push(
    `${file}: ${r.movements} movements, ${r.sequences.length} sequences, ${r.cells.length} participant × condition cells; ` +
      `start ${r.start}, exclude ${r.exclude} (${r.excluded} removed), unit ${r.unit}, width ${r.widthMethod}\n`,
  );
  out.push(
    table(
      "Conditions (mean of participant means; SD; 95 % t interval)",
      ["condition", "n", "TP bits/s", "SD", "95 % CI", "MT ms", "SD", "error %", "SD"],
      r.conditions.map((c) => [
        c.condition,
        String(c.n),
        f(c.tp.mean),
        f(c.tp.sd),
        `[${f(c.tp.ci95[0])}, ${f(c.tp.ci95[1])}]`,
        f(c.mt.mean, 0),
        f(c.mt.sd, 0),
        f(100 * c.errorRate.mean, 1),
        f(100 * c.errorRate.sd, 1),
      ]),
    ),
  );
  out.push(
    table(
      "Fitts regression MT = a + b·IDe (A×W means)",
      ["condition", "a ms", "b ms/bit", "r²", "points", "b on ID", "r² on ID"],
      r.regression.map((g, i) => [g.condition, f(g.intercept, 0), f(g.slope, 1), f(g.r2, 3), String(g.points), f(r.regressionNominal[i]?.slope ?? Number.NaN, 1), f(r.regressionNominal[i]?.r2 ?? Number.NaN, 3)]),
    ),
  );
  out.push(
    table(
      `Repeated-measures ANOVA on TP (${r.missing.participantsIncluded} participants; ${r.missing.participantsExcluded} left out for missing cells)`,
      ["effect", "df1", "df2", "F", "p", "ε GG", "p GG", "ε HF", "p HF", "η²p", "η²G", "Mauchly W", "p"],
      r.anova.map((a) => [a.effect, String(a.df1), String(a.df2), f(a.F, 2), pv(a.p), f(a.epsilonGG, 3), pv(a.pGG), f(a.epsilonHF, 3), pv(a.pHF), f(a.partialEta2, 3), f(a.generalizedEta2, 3), f(a.mauchly.W, 3), pv(a.mauchly.p)]),
    ),
  );
  for (const [name, rows] of [["MT", r.anovaMt], ["error rate", r.anovaErrorRate]] as const) {
    if (rows) out.push(table(`Repeated-measures ANOVA on ${name}`, ["effect", "df1", "df2", "F", "p", "p GG", "η²p"], rows.map((a) => [a.effect, String(a.df1), String(a.df2), f(a.F, 2), pv(a.p), pv(a.pGG), f(a.partialEta2, 3)])));
  }
  out.push(
    table(
      "Post hoc paired t-tests on TP (Holm)",
      ["pair", "diff", "t", "df", "p", "p Holm", "d_z"],
      r.posthoc.map((h) => [`${h.a} – ${h.b}`, f(h.meanDiff, 3), f(h.t, 2), String(h.df), pv(h.p), pv(h.pHolm), f(h.dz, 2)]),
    ),
  );
  if (r.friedman) out.push(`Friedman test on error rate: χ²(${r.friedman.df}) = ${f(r.friedman.statistic, 2)}, p = ${pv(r.friedman.p)}, n = ${r.friedman.n}\n`);
  if (r.sequencesDropped.length > 0) out.push(`${r.sequencesDropped.length} sequence(s) kept fewer than 2 movements after exclusion and were left out\n`);
  for (const note of r.notes) out.push(`note: ${note}\n`);
  return out.join("\n");
}
