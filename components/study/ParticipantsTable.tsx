"use client";

import Link from "next/link";
import { useMemo, useState } from "react";
import { SortableHead } from "@/components/ui/SortableHead";
import { createColumnHelper, flexRender, getCoreRowModel, getFilteredRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";
import { apiSend } from "./api";
import { ActionMessageView, useAction } from "./useAction";

/** A participant as the table shows them (dates as ISO text: the rows cross from the server). */
export type ParticipantTableRow = {
  id: number; code: string; kind: "real" | "pilot" | "simulated"; included: boolean; source: string; status: string; stage: string;
  deviceVerdict: string | null; device: string; sensor: string; completionCode: string | null; revoked: boolean; protocolVersion: number | null;
  row: number | null; place: string | null; exclusion: string | null; exclusionId: number | null; excludedSequences: number; flags: string[];
  lastActivity: string; panelId: string | null;
};

const STATUS: Record<string, string> = { invited: "invited", consented: "consented", in_progress: "in progress", completed: "completed", withdrawn: "withdrawn" };
const col = createColumnHelper<ParticipantTableRow>();

/**
 * The study's participants, sortable by every column and filtered by text and status (TanStack
 * Table, as the studies list). Real participants and pilots are shown in separate tables; the team
 * excludes (with a reason) and takes exclusions back here, includes or deletes pilots.
 */
export function ParticipantsTable({ studyId, rows, canEdit, pilots, showPanel }: { studyId: number; rows: ParticipantTableRow[]; canEdit: boolean; pilots: boolean; showPanel: boolean }) {
  const { msg, act } = useAction();
  const [sorting, setSorting] = useState<SortingState>([]);
  const [text, setText] = useState("");
  const [status, setStatus] = useState("");
  const [excluding, setExcluding] = useState<{ id: number; code: string; reason: string } | null>(null);
  const columns = useMemo(
    () => [
      col.accessor("code", { header: "Code", cell: (c) => <Link href={`/studies/${studyId}/participants/${c.row.original.id}`} className="whitespace-nowrap font-mono">{c.getValue()}</Link> }),
      ...(pilots ? [col.accessor("kind", { header: "Kind" })] : [col.accessor("source", { header: "Source" })]),
      col.accessor((r) => (r.revoked ? "revoked" : STATUS[r.status] ?? r.status), { id: "status", header: "Status", filterFn: (row, _id, value: string) => !value || row.original.status === value }),
      col.accessor("stage", { header: "Stage" }),
      col.accessor((r) => r.deviceVerdict ?? "—", { id: "verdict", header: "Device check" }),
      col.accessor("device", { header: "Device · browser · OS" }),
      col.accessor("sensor", { header: "Sensor" }),
      ...(pilots ? [] : [col.accessor((r) => r.completionCode ?? "—", { id: "completion", header: "Completion code", cell: (c) => <span className="whitespace-nowrap font-mono">{c.getValue()}</span> })]),
      col.accessor((r) => r.protocolVersion ?? "—", { id: "version", header: "Version" }),
      ...(pilots ? [] : [col.accessor((r) => (r.row === null ? "—" : `${r.row}${r.place && r.place !== "holds" ? ` (${r.place})` : ""}`), { id: "row", header: "Row" })]),
      col.accessor((r) => (r.exclusion ? `excluded: ${r.exclusion}` : r.excludedSequences > 0 ? `${r.excludedSequences} sequence(s) excluded` : pilots ? (r.included ? "included" : "left out") : "—"), { id: "exclusion", header: pilots ? "In results" : "Exclusion" }),
      col.accessor((r) => r.flags.join("; ") || "—", { id: "flags", header: "Data quality" }),
      ...(showPanel ? [col.accessor((r) => r.panelId ?? "—", { id: "panel", header: "Panel id" })] : []),
      col.accessor("lastActivity", { header: "Last activity (UTC)" }),
      ...(canEdit
        ? [col.display({
            id: "actions", header: "Actions",
            cell: (c) => {
              const r = c.row.original;
              if (pilots) {
                return (
                  <div className="flex flex-wrap gap-1">
                    <button type="button" className="btn-secondary" onClick={() => void act(() => apiSend("PATCH", `/api/studies/${studyId}/pilots/${r.id}`, { included: !r.included }), r.included ? `${r.code} is left out of results and archives.` : `${r.code} is included in results and archives.`)}>{r.included ? "Leave out" : "Include"}</button>
                    <button type="button" className="btn-secondary" onClick={() => { if (window.confirm(`Delete ${r.code} and everything it recorded?`)) void act(() => apiSend("DELETE", `/api/studies/${studyId}/pilots/${r.id}`), `${r.code} is deleted.`); }}>Delete</button>
                  </div>
                );
              }
              if (r.exclusionId !== null) return <button type="button" className="btn-secondary" onClick={() => void act(() => apiSend("DELETE", `/api/studies/${studyId}/exclusions/${r.exclusionId}`), `${r.code} is back in the results.`)}>Take back exclusion</button>;
              if (r.status === "invited") return null;
              return <button type="button" className="btn-secondary" onClick={() => setExcluding({ id: r.id, code: r.code, reason: r.flags[0] ?? "" })}>Exclude…</button>;
            },
          })]
        : []),
    ],
    // eslint-disable-next-line react-hooks/exhaustive-deps
    [studyId, canEdit, pilots, showPanel],
  );
  const columnFilters = useMemo(() => (status ? [{ id: "status", value: status }] : []), [status]);
  const table = useReactTable({
    data: rows, columns,
    // one filter array per status value: a new array on every render would make the filtered rows "change" on
    // every render, and TanStack Table's page-index reset would then re-render without end (a frozen page)
    state: { sorting, globalFilter: text, columnFilters },
    autoResetPageIndex: false,
    onSortingChange: setSorting, getCoreRowModel: getCoreRowModel(), getSortedRowModel: getSortedRowModel(), getFilteredRowModel: getFilteredRowModel(), globalFilterFn: "includesString",
  });
  const label = pilots ? "Pilots" : "Participants";
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap gap-3">
        <label className="flex items-center gap-2">Filter <input className="input w-64" value={text} onChange={(e) => setText(e.target.value)} placeholder="code, stage, device, reason" aria-label={`Filter ${label.toLowerCase()}`} /></label>
        <label className="flex items-center gap-2">Status
          <select className="input w-40" value={status} onChange={(e) => setStatus(e.target.value)} aria-label={`${label}: status`}>
            <option value="">any</option>{Object.entries(STATUS).map(([v, l]) => <option key={v} value={v}>{l}</option>)}
          </select>
        </label>
      </div>
      {excluding && (
        <form className="card flex flex-wrap items-end gap-2" onSubmit={(e) => {
          e.preventDefault();
          void act(() => apiSend("POST", `/api/studies/${studyId}/exclusions`, { scope: "participant", participantId: excluding.id, reason: excluding.reason }), `${excluding.code} is excluded: the results and archives leave them out and report the reason.`).then((done) => done && setExcluding(null));
        }}>
          <div className="min-w-[20rem] flex-1"><label htmlFor="exclusion-reason">Exclude {excluding.code}: reason (reported in the results, the archive and its methods text)</label>
            {/* focused: the form opens on the person's own click, possibly far above the row they clicked */}
            <input id="exclusion-reason" className="input" autoFocus value={excluding.reason} onChange={(e) => setExcluding({ ...excluding, reason: e.target.value })} /></div>
          <button className="btn">Exclude {excluding.code}</button>
          <button type="button" className="btn-secondary" onClick={() => setExcluding(null)}>Cancel</button>
        </form>
      )}
      <ActionMessageView msg={msg} />
      <div className="card overflow-x-auto p-0">
        <table aria-label={label}>
          <SortableHead table={table} />
          <tbody>
            {table.getRowModel().rows.map((r) => (
              <tr key={r.id} data-code={r.original.code}>{r.getVisibleCells().map((c) => <td key={c.id} data-col={c.column.id}>{flexRender(c.column.columnDef.cell, c.getContext())}</td>)}</tr>
            ))}
            {table.getRowModel().rows.length === 0 && <tr><td colSpan={columns.length}>{rows.length === 0 ? `No ${label.toLowerCase()} yet.` : "None matches."}</td></tr>}
          </tbody>
        </table>
      </div>
    </div>
  );
}
