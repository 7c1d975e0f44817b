"use client";

import { flexRender, type Table } from "@tanstack/react-table";

/** A TanStack table's header: each sortable column a button that says its direction in words (aria-sort too). */
export function SortableHead<T>({ table }: { table: Table<T> }) {
  return (
    <thead>
      {table.getHeaderGroups().map((g) => (
        <tr key={g.id}>
          {g.headers.map((h) => {
            const dir = h.column.getIsSorted();
            return (
              <th key={h.id} aria-sort={dir === "asc" ? "ascending" : dir === "desc" ? "descending" : "none"}>
                {h.column.getCanSort() ? (
                  <button type="button" className="font-semibold" onClick={h.column.getToggleSortingHandler()}>
                    {flexRender(h.column.columnDef.header, h.getContext())} {dir === "asc" ? "(ascending)" : dir === "desc" ? "(descending)" : ""}
                  </button>
                ) : flexRender(h.column.columnDef.header, h.getContext())}
              </th>
            );
          })}
        </tr>
      ))}
    </thead>
  );
}
