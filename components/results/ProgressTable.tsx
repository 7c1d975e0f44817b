import type { ResultsView } from "@/lib/results";
import { PARTICIPANT_STATUSES } from "@/lib/results/progressCounts";

const LABEL: Record<(typeof PARTICIPANT_STATUSES)[number], string> = { invited: "invited", consented: "consented", in_progress: "in progress", completed: "completed", withdrawn: "withdrawn" };

/** Participants per status, overall and per counterbalancing row. */
export function ProgressTable({ view }: { view: ResultsView }) {
  const p = view.progress;
  return (
    <table data-testid="progress-table">
      <caption className="caption-bottom pt-1 text-left text-sm text-slate-700">
        Participants by status and counterbalancing row; {p.byStatus.completed} of {view.plannedParticipants} planned have completed.
      </caption>
      <thead><tr><th>row</th>{PARTICIPANT_STATUSES.map((s) => <th key={s}>{LABEL[s]}</th>)}<th>total</th></tr></thead>
      <tbody>
        {p.byRow.map((r) => (
          <tr key={String(r.row)}><td>{r.row === null ? "not assigned" : `row ${r.row + 1}`}</td>{PARTICIPANT_STATUSES.map((s) => <td key={s}>{r.counts[s]}</td>)}<td>{r.total}</td></tr>
        ))}
        <tr className="font-semibold"><td>all</td>{PARTICIPANT_STATUSES.map((s) => <td key={s}>{p.byStatus[s]}</td>)}<td>{p.total}</td></tr>
      </tbody>
    </table>
  );
}
