"use client";

import Link from "next/link";
import { useMemo, useState } from "react";
import { SortableHead } from "@/components/ui/SortableHead";
import { createColumnHelper, flexRender, getCoreRowModel, getFilteredRowModel, getSortedRowModel, useReactTable, type SortingState } from "@tanstack/react-table";

export type StudyTableRow = { id: number; title: string; status: string; statusLabel: string; protocolNumber: string | null; ownerName: string; myRole: string | null; updated: string };

const col = createColumnHelper<StudyTableRow>();

/** The researcher's studies: sortable by every column, filtered by text and status (TanStack Table). */
export function StudiesTable({ rows }: { rows: StudyTableRow[] }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: "updated", desc: true }]);
  const [text, setText] = useState("");
  const [status, setStatus] = useState("");
  const columns = useMemo(
    () => [
      col.accessor("title", { header: "Title", cell: (c) => <Link href={`/studies/${c.row.original.id}`}>{c.getValue()}</Link> }),
      col.accessor("statusLabel", { id: "status", header: "Status", filterFn: (row, _id, value: string) => !value || row.original.status === value }),
      col.accessor((r) => r.protocolNumber ?? "—", { id: "protocol", header: "Protocol" }),
      col.accessor("ownerName", { header: "Owner" }),
      col.accessor((r) => r.myRole ?? "—", { id: "role", header: "Your role" }),
      col.accessor("updated", { header: "Updated" }),
    ],
    [],
  );
  const columnFilters = useMemo(() => (status ? [{ id: "status", value: status }] : []), [status]);
  const table = useReactTable({
    data: rows,
    columns,
    // one filter array per status value: a new array on every render would make the filtered rows "change" on
    // every render, and TanStack Table's page-index reset would then re-render without end (a frozen page)
    state: { sorting, globalFilter: text, columnFilters },
    autoResetPageIndex: false,
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    globalFilterFn: "includesString",
  });
  return (
    <div className="space-y-2">
      <div className="flex flex-wrap gap-3">
        <label className="flex items-center gap-2">Filter <input className="input w-64" value={text} onChange={(e) => setText(e.target.value)} placeholder="title, protocol, owner" /></label>
        <label className="flex items-center gap-2">Status
          <select className="input w-40" value={status} onChange={(e) => setStatus(e.target.value)}>
            <option value="">any</option><option value="draft">Draft</option><option value="in_review">In review</option><option value="approved">Approved</option><option value="recruiting">Recruiting</option><option value="closed">Closed</option>
          </select>
        </label>
      </div>
      <div className="card overflow-x-auto p-0">
        <table>
          <SortableHead table={table} />
          <tbody>
            {table.getRowModel().rows.map((r) => (
              <tr key={r.id}>{r.getVisibleCells().map((c) => <td key={c.id}>{flexRender(c.column.columnDef.cell, c.getContext())}</td>)}</tr>
            ))}
            {table.getRowModel().rows.length === 0 && <tr><td colSpan={6}>No study matches.</td></tr>}
          </tbody>
        </table>
      </div>
    </div>
  );
}
