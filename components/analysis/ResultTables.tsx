import type { AnalysisResult } from "@/lib/analysis";
import { AnovaTable, BetweenGroupsTable, GroupConditionTable, PosthocTable } from "@/components/results/StatsTables";
import { fmt, pct } from "./format";

/** The analysis as tables: condition summaries, regressions, ANOVA, post hoc, cells and sequences. */
export function ResultTables({ result }: { result: AnalysisResult }) {
  const u = result.unit;
  return (
    <div className="space-y-6">
      <p className="text-sm text-slate-700">
        {result.movements} movements; {result.excluded} removed ({result.exclusions.misfire} misfires: distance along the axis &lt; A/2 or |P − T| &gt; 2W; {result.exclusions.mt3sd} movement times beyond the participant × condition&apos;s mean ± 3 SD; {result.exclusions.timed_out + result.exclusions.recentered + result.exclusions.clutched} flagged) under the rule &ldquo;{result.exclude}&rdquo;; {result.timeoutsKept} time-out(s) kept as errors; coordinates read as {result.geometry === "sphere" ? "view directions on the sphere" : "points in a plane"};
        start point: {result.start === "actual" ? "the previous selection point" : "the previous target's centre"}; effective width {result.widthMethod === "effective" ? "We = 4.133 · SDx" : "from the error rate (legacy data, flagged)"}.
        {result.missing.participantsExcluded > 0 && ` ${result.missing.participantsExcluded} participant(s) lacking a condition were left out of the ANOVA.`}
      </p>
      {result.notes.length > 0 && <ul className="notice list-inside list-disc">{result.notes.map((n) => <li key={n}>{n}</li>)}</ul>}

      <Section title="Conditions (mean of participants' means)">
        <table>
          <thead><tr><th>Condition</th><th>n</th><th>TP (bits/s)</th><th>95 % CI</th><th>MT (ms)</th><th>Error rate</th></tr></thead>
          <tbody>
            {result.conditions.map((c) => (
              <tr key={c.condition}>
                <td>{c.condition}</td><td>{c.n}</td><td>{fmt(c.tp.mean)} ± {fmt(c.tp.sd)}</td><td>[{fmt(c.tp.ci95[0])}, {fmt(c.tp.ci95[1])}]</td>
                <td>{fmt(c.mt.mean, 0)}</td><td>{fmt(pct(c.errorRate.mean), 1)} %</td>
              </tr>
            ))}
          </tbody>
        </table>
      </Section>

      <Section title="Fitts regression MT = a + b · IDe (per condition, over A×W means)">
        <table>
          <thead><tr><th>Condition</th><th>a (ms)</th><th>b (ms/bit)</th><th>r²</th></tr></thead>
          <tbody>{result.regression.map((r) => <tr key={r.condition}><td>{r.condition}</td><td>{fmt(r.intercept, 0)}</td><td>{fmt(r.slope, 0)}</td><td>{fmt(r.r2, 3)}</td></tr>)}</tbody>
        </table>
      </Section>

      {result.conditionsByGroup && (
        <Section title="Conditions by group">
          <GroupConditionTable analysis={result} />
        </Section>
      )}

      <Section title="ANOVA on throughput">
        <AnovaTable rows={result.anova} caption="Within effects against their own effect × participant error, between effects (b_ columns) against participants within groups; GG and HF (as R reports it) corrected p; Mauchly's test." />
      </Section>

      <Section title="Post hoc tests (Holm-corrected)">
        <div className="space-y-4">
          <PosthocTable rows={result.posthoc} caption="Paired t tests of TP between conditions over participants; p Holm-corrected over all pairs." />
          {result.posthocWithinGroups && <PosthocTable rows={result.posthocWithinGroups} caption="The same within each group; Holm over all rows." />}
          {result.posthocBetweenGroups && <BetweenGroupsTable rows={result.posthocBetweenGroups} />}
        </div>
      </Section>

      <Section title="Participant × condition cells">
        <table>
          <thead><tr><th>Participant</th><th>Condition</th><th>TP (bits/s)</th><th>MT (ms)</th><th>Error rate</th><th>We ({u})</th><th>IDe (bits)</th></tr></thead>
          <tbody>
            {result.cells.map((c) => (
              <tr key={`${c.participant}|${c.condition}`}><td>{c.participant}</td><td>{c.condition}</td><td>{fmt(c.tp)}</td><td>{fmt(c.mt, 0)}</td><td>{fmt(pct(c.errorRate), 1)} %</td><td>{fmt(c.we)}</td><td>{fmt(c.ide)}</td></tr>
            ))}
          </tbody>
        </table>
      </Section>

      <details className="card">
        <summary className="cursor-pointer font-semibold">Sequences ({result.sequences.length})</summary>
        <div className="mt-2 overflow-x-auto">
          <table>
            <thead><tr><th>Participant</th><th>Condition</th><th>Block</th><th>Seq.</th><th>A</th><th>W</th><th>n</th><th>Ae</th><th>We</th><th>IDe</th><th>MT (ms)</th><th>TP</th><th>Errors</th></tr></thead>
            <tbody>
              {result.sequences.map((s) => (
                <tr key={`${s.participant}|${s.condition}|${s.block}|${s.sequence}`}>
                  <td>{s.participant}</td><td>{s.condition}</td><td>{s.block}</td><td>{s.sequence}</td><td>{s.amplitude}</td><td>{s.width}</td><td>{s.n}</td>
                  <td>{fmt(s.ae)}</td><td>{fmt(s.we)}</td><td>{fmt(s.ide)}</td><td>{fmt(s.mt, 0)}</td><td>{fmt(s.tp)}</td><td>{fmt(pct(s.errorRate), 1)} %</td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </details>
    </div>
  );
}

function Section({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section className="card overflow-x-auto">
      <h2 className="mb-2">{title}</h2>
      {children}
    </section>
  );
}
