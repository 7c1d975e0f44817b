import type { ResultsView } from "@/lib/results";
import { fmt, fmtP, pct } from "./chartStyle";

type Analysis = NonNullable<ResultsView["analysis"]>;

/** Repeated-measures ANOVA rows of one measure. */
export function AnovaTable({ rows, caption }: { rows: Analysis["anova"]; caption: string }) {
  return (
    <table>
      <caption className="caption-bottom pt-1 text-left text-sm text-slate-700">{caption}</caption>
      <thead><tr><th>effect</th><th>df1</th><th>df2</th><th>F</th><th>p</th><th>ε (GG)</th><th>p (GG)</th><th>partial η²</th></tr></thead>
      <tbody>
        {rows.map((r) => (
          <tr key={r.effect}><td>{r.effect}</td><td>{fmt(r.df1, 0)}</td><td>{fmt(r.df2, 0)}</td><td>{fmt(r.F)}</td><td>{fmtP(r.p)}</td><td>{fmt(r.epsilonGG, 3)}</td><td>{fmtP(r.pGG)}</td><td>{fmt(r.partialEta2, 3)}</td></tr>
        ))}
      </tbody>
    </table>
  );
}

/** Paired comparisons of conditions (TP), Holm-corrected. */
export function PosthocTable({ rows }: { rows: Analysis["posthoc"] }) {
  return (
    <table>
      <caption className="caption-bottom pt-1 text-left text-sm text-slate-700">Paired t tests of TP between conditions over participants; p Holm-corrected over all pairs; d_z = mean difference / SD of differences. Differences in bits/s.</caption>
      <thead><tr><th>a</th><th>b</th><th>a − b</th><th>t</th><th>df</th><th>p</th><th>p (Holm)</th><th>d_z</th></tr></thead>
      <tbody>
        {rows.map((r) => (
          <tr key={`${r.a}|${r.b}`}><td>{r.a}</td><td>{r.b}</td><td>{fmt(r.meanDiff)}</td><td>{fmt(r.t)}</td><td>{fmt(r.df, 0)}</td><td>{fmtP(r.p)}</td><td>{fmtP(r.pHolm)}</td><td>{fmt(r.dz)}</td></tr>
        ))}
      </tbody>
    </table>
  );
}

/** Per-condition summary table (the numbers behind the bar charts). */
export function ConditionTable({ analysis }: { analysis: Analysis }) {
  const fits = new Map(analysis.regression.map((r) => [r.condition, r]));
  return (
    <table>
      <caption className="caption-bottom pt-1 text-left text-sm text-slate-700">Means over participants (n) of their cell means; 95 % t intervals in brackets. Regression of MT on IDe over the A×W means: a in ms, b in ms/bit.</caption>
      <thead><tr><th>condition</th><th>n</th><th>TP (bits/s)</th><th>MT (ms)</th><th>error rate (%)</th><th>a (ms)</th><th>b (ms/bit)</th><th>r²</th></tr></thead>
      <tbody>
        {analysis.conditions.map((c) => {
          const f = fits.get(c.condition);
          return (
            <tr key={c.condition}>
              <td>{c.condition}</td><td>{c.n}</td>
              <td>{fmt(c.tp.mean)} [{fmt(c.tp.ci95[0])}, {fmt(c.tp.ci95[1])}]</td>
              <td>{fmt(c.mt.mean, 0)} [{fmt(c.mt.ci95[0], 0)}, {fmt(c.mt.ci95[1], 0)}]</td>
              <td>{fmt(pct(c.errorRate.mean), 1)} [{fmt(pct(c.errorRate.ci95[0]), 1)}, {fmt(pct(c.errorRate.ci95[1]), 1)}]</td>
              <td>{fmt(f?.intercept, 0)}</td><td>{fmt(f?.slope, 0)}</td><td>{fmt(f?.r2, 3)}</td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}
