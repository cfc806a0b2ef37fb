import { flexRender, type Table } from "@tanstack/react-table";

import { cn } from "@/lib/cn";

export interface SortableTableHeadProps<TRow> {
  table: Table<TRow>;
  /** Padding and wrapping of the header cells, to line up with the table's own cells. */
  cellClassName?: string;
}

/**
 * The header of a TanStack table: a sort button in each sortable column, `aria-sort` on the
 * sorted one. Hidden on phones, where rows become cards that label their own values.
 */
export function SortableTableHead<TRow>({ table, cellClassName }: SortableTableHeadProps<TRow>) {
  return (
    <thead role="rowgroup" className="sr-only md:not-sr-only md:table-header-group">
      {table.getHeaderGroups().map((group) => (
        <tr role="row" key={group.id}>
          {group.headers.map((header) => {
            const sorted = header.column.getIsSorted();
            const label = flexRender(header.column.columnDef.header, header.getContext());
            return (
              <th
                role="columnheader"
                key={header.id}
                scope="col"
                aria-sort={
                  sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : undefined
                }
                className={cn(
                  "border-b-2 border-surface-line px-3 py-2 text-left text-sm font-semibold text-ink-muted",
                  cellClassName,
                )}
              >
                {header.column.getCanSort() ? (
                  <button
                    type="button"
                    onClick={header.column.getToggleSortingHandler()}
                    className="inline-flex min-h-tap items-center gap-1 rounded font-semibold hover:text-ink"
                  >
                    {label}
                    <span aria-hidden="true" className="w-3">
                      {sorted === "asc" ? "▲" : sorted === "desc" ? "▼" : ""}
                    </span>
                  </button>
                ) : (
                  label
                )}
              </th>
            );
          })}
        </tr>
      ))}
    </thead>
  );
}
