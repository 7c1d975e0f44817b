import type { ResultsView } from "@/lib/results";
import { fmt } from "./chartStyle";

type Analysis = NonNullable<ResultsView["analysis"]>;

/** Path accuracy per condition (MacKenzie, Kauppinen & Silfverberg 2001), with how far the computation got. */
export function PathTable({ analysis, status, unit }: { analysis: Analysis; status: ResultsView["paths"]; unit: string }) {
  const rows = analysis.conditions.filter((c) => c.path);
  return (
    <div className="space-y-2" data-testid="path-accuracy">
      {status && (
        <p className="text-sm">
          Path measures from the recorded streams: {status.computed} of {status.sequences} sequences
          {status.pending > 0 ? `; ${status.pending} still being computed (the page fills them in as it refreshes)` : ""}
          {status.notComputable.length > 0 ? `; ${status.notComputable.length} not computable` : ""}.
        </p>
      )}
      {rows.length > 0 && (
        <table>
          <caption className="caption-bottom pt-1 text-left text-sm text-slate-700">
            Means over participants of their per-condition means, per movement: TRE target re-entries, TAC task-axis crossings, MDC movement direction changes, ODC orthogonal direction changes (counts); MV movement variability, ME movement error, MO movement offset ({unit}). Each movement&apos;s path is its condition&apos;s configuration replayed over the recorded stream; changes within a band of 5 % of W are not counted (sensor noise).
          </caption>
          <thead><tr><th>condition</th><th>participants</th><th>movements</th><th>TRE</th><th>TAC</th><th>MDC</th><th>ODC</th><th>MV</th><th>ME</th><th>MO</th></tr></thead>
          <tbody>
            {rows.map((c) => (
              <tr key={c.condition}>
                <td>{c.condition}</td><td>{c.path!.participants}</td><td>{c.path!.movements}</td>
                <td>{fmt(c.path!.tre)}</td><td>{fmt(c.path!.tac)}</td><td>{fmt(c.path!.mdc)}</td><td>{fmt(c.path!.odc)}</td>
                <td>{fmt(c.path!.mv)}</td><td>{fmt(c.path!.me)}</td><td>{fmt(c.path!.mo)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {status && status.notComputable.length > 0 && (
        <details className="text-sm">
          <summary>Sequences without path measures</summary>
          <ul className="list-disc pl-5">
            {status.notComputable.slice(0, 50).map((n) => <li key={`${n.participant}|${n.condition}|${n.block}|${n.sequence}`}>{n.participant}, {n.condition}, block {n.block}, sequence {n.sequence}: {n.reason}</li>)}
          </ul>
        </details>
      )}
    </div>
  );
}
