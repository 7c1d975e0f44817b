import type { PlaceCell } from "@/lib/study/counterbalance";
import { conditionsOf, type StudyDesign } from "@/lib/study/design";
import { betweenGroupCount } from "@/lib/study/counterbalance";

/**
 * Counterbalancing rows filled, in progress and free: completed participants fill a row's planned
 * places; those in progress hold theirs; places released by drop-outs are free again and go to the
 * next participants, so the completed sample stays balanced.
 */
export function PlaceBalanceTable({ cells, released, design }: { cells: PlaceCell[]; released: number; design: StudyDesign }) {
  const labels = conditionsOf(design).map((c) => c.label);
  const groups = betweenGroupCount(design) > 1;
  const total = cells.reduce((a, c) => ({ completed: a.completed + c.completed, inProgress: a.inProgress + c.inProgress, free: a.free + c.free }), { completed: 0, inProgress: 0, free: 0 });
  return (
    <section className="card space-y-2" aria-labelledby="balance-heading">
      <h2 id="balance-heading">Counterbalancing rows</h2>
      <p className="text-sm">
        {total.completed} filled, {total.inProgress} in progress, {total.free} free of {design.plannedParticipants} planned. A participant takes a row when their first sequence starts; a device-check refusal, a withdrawal or inactivity gives it back, and the next participant takes the first free row.
        {released > 0 ? ` ${released} place(s) were given back so far.` : ""}
      </p>
      <table aria-label="Counterbalancing rows" data-testid="place-balance">
        <thead><tr>{groups && <th>Group</th>}<th>Row</th><th>Condition order</th><th>Planned</th><th>Filled</th><th>In progress</th><th>Free</th></tr></thead>
        <tbody>
          {cells.map((c) => (
            <tr key={`${c.group}-${c.row}`} data-row={c.row} data-group={c.group}>
              {groups && <td>{c.group + 1}</td>}
              <td>{c.row + 1}</td>
              <td className="text-xs">{c.order.map((i) => labels[i]).join(" → ")}</td>
              <td>{c.planned}</td><td data-col="filled">{c.completed}</td><td data-col="in-progress">{c.inProgress}</td><td data-col="free">{c.free}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </section>
  );
}
