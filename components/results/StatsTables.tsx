import type { ResultsView } from "@/lib/results";
import { fmt, fmtP, pct } from "./chartStyle";

type Analysis = NonNullable<ResultsView["analysis"]>;

const KIND: Record<Analysis["anova"][number]["kind"], string> = { within: "within", between: "between", mixed: "within × between" };

/** ANOVA rows of one measure, with the sphericity figures and the reason where a statistic cannot be computed. */
export function AnovaTable({ rows, caption }: { rows: Analysis["anova"]; caption: string }) {
  const notes = rows.filter((r) => r.note);
  return (
    <div className="space-y-1">
      <table>
        <caption className="caption-bottom pt-1 text-left text-sm text-slate-700">{caption}</caption>
        <thead>
          <tr><th>effect</th><th>kind</th><th>df1</th><th>df2</th><th>F</th><th>p</th><th>ε (GG)</th><th>p (GG)</th><th>ε (HF)</th><th>p (HF)</th><th>Mauchly W</th><th>p</th><th>partial η²</th><th>generalised η²</th></tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.effect}>
              <td>{r.effect}</td><td>{KIND[r.kind]}</td><td>{fmt(r.df1, 0)}</td><td>{fmt(r.df2, 0)}</td><td>{fmt(r.F)}</td><td>{fmtP(r.p)}</td>
              <td>{fmt(r.epsilonGG, 3)}</td><td>{fmtP(r.pGG)}</td><td>{fmt(r.epsilonHF, 3)}</td><td>{fmtP(r.pHF)}</td>
              <td>{fmt(r.mauchly?.W, 3)}</td><td>{fmtP(r.mauchly?.p)}</td><td>{fmt(r.partialEta2, 3)}</td><td>{fmt(r.generalizedEta2, 3)}</td>
            </tr>
          ))}
        </tbody>
      </table>
      {notes.length > 0 && (
        <ul className="list-disc pl-5 text-sm" data-testid="anova-notes">
          {notes.map((r) => <li key={r.effect}>{r.effect}: {r.note}{r.pLowerBound !== null ? ` (p with the lower-bound ε: ${fmtP(r.pLowerBound)})` : ""}.</li>)}
        </ul>
      )}
    </div>
  );
}

/** Paired comparisons of conditions (TP), Holm-corrected; with `group`, within each group. */
export function PosthocTable({ rows, caption }: { rows: (Analysis["posthoc"][number] & { group?: string })[]; caption: string }) {
  const grouped = rows.some((r) => r.group !== undefined);
  return (
    <table>
      <caption className="caption-bottom pt-1 text-left text-sm text-slate-700">{caption}</caption>
      <thead><tr>{grouped && <th>group</th>}<th>a</th><th>b</th><th>a − b</th><th>t</th><th>df</th><th>p</th><th>p (Holm)</th><th>d_z</th></tr></thead>
      <tbody>
        {rows.map((r) => (
          <tr key={`${r.group ?? ""}|${r.a}|${r.b}`} title={r.note ?? undefined}>{grouped && <td>{r.group}</td>}<td>{r.a}</td><td>{r.b}</td><td>{fmt(r.meanDiff)}</td><td>{fmt(r.t)}</td><td>{fmt(r.df, 0)}</td><td>{fmtP(r.p)}</td><td>{fmtP(r.pHolm)}</td><td>{fmt(r.dz)}</td></tr>
        ))}
      </tbody>
    </table>
  );
}

/** Groups compared in each condition (Welch's t), Holm-corrected. */
export function BetweenGroupsTable({ rows }: { rows: NonNullable<Analysis["posthocBetweenGroups"]> }) {
  return (
    <table data-testid="between-groups">
      <caption className="caption-bottom pt-1 text-left text-sm text-slate-700">Groups compared within each condition on TP: Welch&apos;s t (unequal variances), p Holm-corrected over all rows; d = difference / root mean square of the two SDs.</caption>
      <thead><tr><th>condition</th><th>group a</th><th>group b</th><th>a − b</th><th>t</th><th>df</th><th>p</th><th>p (Holm)</th><th>d</th></tr></thead>
      <tbody>
        {rows.map((r) => (
          <tr key={`${r.condition}|${r.a}|${r.b}`} title={r.note ?? undefined}><td>{r.condition}</td><td>{r.a}</td><td>{r.b}</td><td>{fmt(r.meanDiff)}</td><td>{fmt(r.t)}</td><td>{fmt(r.df, 1)}</td><td>{fmtP(r.p)}</td><td>{fmtP(r.pHolm)}</td><td>{fmt(r.d)}</td></tr>
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

/** Each condition within each group (mixed designs). */
export function GroupConditionTable({ analysis }: { analysis: Analysis }) {
  const rows = analysis.conditionsByGroup ?? [];
  return (
    <table data-testid="groups-table">
      <caption className="caption-bottom pt-1 text-left text-sm text-slate-700">
        Each condition within each group of the between-subject factor{(analysis.groups?.factors.length ?? 0) > 1 ? "s" : ""} {analysis.groups?.factors.join(" × ")}: means over the group&apos;s participants (n) of their cell means, 95 % t intervals in brackets.
      </caption>
      <thead><tr><th>group</th><th>condition</th><th>n</th><th>TP (bits/s)</th><th>MT (ms)</th><th>error rate (%)</th></tr></thead>
      <tbody>
        {rows.map((c) => (
          <tr key={`${c.group}|${c.condition}`}>
            <td>{c.group}</td><td>{c.condition}</td><td>{c.n}</td>
            <td>{fmt(c.tp.mean)} [{fmt(c.tp.ci95[0])}, {fmt(c.tp.ci95[1])}]</td>
            <td>{fmt(c.mt.mean, 0)}</td><td>{fmt(pct(c.errorRate.mean), 1)}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
