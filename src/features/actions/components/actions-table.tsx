import { type Severity, severities } from "@shared/calc/verdict";
import { type ActionState, type ActionSummary, actionStates } from "@shared/schemas/actions";
import {
  type ColumnFiltersState,
  createColumnHelper,
  type FilterFn,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  type SortingFn,
  type SortingState,
  useReactTable,
} from "@tanstack/react-table";
import { useMemo, useState } from "react";
import { Link } from "react-router-dom";

import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/select-field";
import { SortableTableHead } from "@/components/ui/sortable-table-head";
import { linkStyles } from "@/components/ui/text-link";
import { cn } from "@/lib/cn";

import { daysToCloseText, dueText, severityLabels } from "../lib/action-labels";
import {
  type ActionListState,
  type ActionTableFilters,
  defaultTableFilters,
  matchesState,
} from "../lib/action-filters";
import { OverdueMark, SeverityBadge, StateBadge } from "./action-badges";

const stateFilter: FilterFn<ActionSummary> = (row, _columnId, state: ActionListState) =>
  matchesState(row.original, state);
stateFilter.autoRemove = (state?: ActionListState) => !state || state === "all";

const rankOf =
  <T extends string>(
    order: readonly T[],
    pick: (action: ActionSummary) => T,
  ): SortingFn<ActionSummary> =>
  (a, b) =>
    order.indexOf(pick(a.original)) - order.indexOf(pick(b.original));

const severityOrder: readonly Severity[] = severities;
const statusOrder: readonly ActionState[] = actionStates;

const column = createColumnHelper<ActionSummary>();

function columnsFor(actionHref: (actionId: string) => string) {
  return [
    column.accessor("title", {
      id: "item",
      header: "Item",
      cell: (info) => (
        <Link
          to={actionHref(info.row.original.id)}
          className={cn(
            linkStyles,
            "inline-flex min-h-tap items-center text-lg md:min-h-0 md:text-base",
          )}
        >
          {info.getValue()}
        </Link>
      ),
    }),
    column.accessor("spaceName", { id: "space", header: "Space" }),
    column.accessor("floorName", { id: "floor", header: "Floor" }),
    column.accessor("severity", {
      header: "Severity",
      filterFn: "equals",
      sortingFn: rankOf(severityOrder, (action) => action.severity),
      cell: (info) => <SeverityBadge severity={info.getValue()} />,
    }),
    column.accessor("state", {
      header: "State",
      filterFn: stateFilter,
      sortingFn: rankOf(statusOrder, (action) => action.state),
      cell: (info) => <StateBadge state={info.getValue()} />,
    }),
    column.accessor((action) => action.assignee?.name ?? "", {
      id: "owner",
      header: "Owner",
      cell: (info) => info.getValue() || <span className="text-ink-muted">No one yet</span>,
    }),
    column.accessor("dueAt", {
      id: "due",
      header: "Due",
      cell: (info) => <span className="whitespace-nowrap">{dueText(info.row.original)}</span>,
    }),
    column.accessor("overdue", {
      header: "Overdue",
      filterFn: "equals",
      sortingFn: (a, b) => Number(a.original.overdue) - Number(b.original.overdue),
      cell: (info) => (info.getValue() ? <OverdueMark /> : <span className="sr-only">No</span>),
    }),
    column.accessor("daysToClose", {
      header: "Days to close",
      sortUndefined: "last",
      sortingFn: (a, b) =>
        (a.original.daysToClose ?? Number.POSITIVE_INFINITY) -
        (b.original.daysToClose ?? Number.POSITIVE_INFINITY),
      cell: (info) => daysToCloseText(info.getValue()),
    }),
  ];
}

// On phones each row becomes a card: the item on top, then the marks, then the details.
const cellPlacement: Record<string, string> = {
  item: "col-span-2",
  space: "",
  floor: "",
  severity: "",
  status: "",
  owner: "col-span-2",
  due: "col-span-2",
  overdue: "",
  daysToClose: "",
};

const labelledOnPhone = new Set(["space", "floor", "owner", "due", "daysToClose"]);

const stateOptions: { value: ActionListState; label: string }[] = [
  { value: "unfinished", label: "Not done" },
  { value: "done", label: "Done" },
  { value: "all", label: "All" },
];

const severityOptions = severities.map((severity) => ({
  value: severity,
  label: severityLabels[severity],
}));

export interface ActionsTableProps {
  actions: readonly ActionSummary[];
  filters: ActionTableFilters;
  onFiltersChange: (filters: ActionTableFilters) => void;
  actionHref: (actionId: string) => string;
  /** The CSV of the list with these filters. */
  exportHref: string;
}

/** A site's actions, sortable by any column and filtered by state, severity and overdue. */
export function ActionsTable({
  actions,
  filters,
  onFiltersChange,
  actionHref,
  exportHref,
}: ActionsTableProps) {
  // No sorting at first: the server's order (unfinished, overdue, then by due time) is the useful one.
  const [sorting, setSorting] = useState<SortingState>([]);
  const data = useMemo(() => [...actions], [actions]);
  const columns = useMemo(() => columnsFor(actionHref), [actionHref]);
  const columnFilters = useMemo<ColumnFiltersState>(() => {
    const list: ColumnFiltersState = [{ id: "state", value: filters.state }];
    if (filters.severity) list.push({ id: "severity", value: filters.severity });
    if (filters.overdueOnly) list.push({ id: "overdue", value: true });
    return list;
  }, [filters]);

  // The table's API returns fresh functions on every render, which the compiler cannot memoise.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data,
    columns,
    state: { columnFilters, sorting },
    onSortingChange: setSorting,
    getRowId: (action) => action.id,
    getCoreRowModel: getCoreRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });

  const rows = table.getRowModel().rows;
  const filtered =
    filters.state !== defaultTableFilters.state || filters.severity !== "" || filters.overdueOnly;
  const change = (next: Partial<ActionTableFilters>) => onFiltersChange({ ...filters, ...next });

  return (
    <div className="flex flex-col gap-4">
      <div
        role="search"
        aria-label="Filter actions"
        className="grid grid-cols-2 items-end gap-3 rounded-card border border-surface-line bg-surface p-4 lg:grid-cols-4"
      >
        <SelectField
          label="State"
          options={stateOptions}
          value={filters.state}
          onChange={(event) => change({ state: event.target.value as ActionListState })}
        />
        <SelectField
          label="Severity"
          placeholder="Any severity"
          options={severityOptions}
          value={filters.severity}
          onChange={(event) => change({ severity: event.target.value as Severity | "" })}
        />
        <label className="col-span-2 flex min-h-tap cursor-pointer items-center gap-3 lg:col-span-1">
          <input
            type="checkbox"
            className="size-5 accent-brand-700"
            checked={filters.overdueOnly}
            onChange={(event) => change({ overdueOnly: event.target.checked })}
          />
          <span className="font-semibold">Overdue only</span>
        </label>
        <a
          href={exportHref}
          download
          className={cn(
            "col-span-2 inline-flex min-h-tap items-center justify-center gap-2 rounded-lg border border-surface-line bg-surface px-4 py-2 font-semibold text-brand-800 hover:bg-brand-50 lg:col-span-1",
          )}
        >
          Download CSV
        </a>
      </div>

      <div className="flex flex-wrap items-center justify-between gap-2">
        <p aria-live="polite" className="text-sm text-ink-muted">
          {`Showing ${rows.length} of ${actions.length} ${actions.length === 1 ? "action" : "actions"}`}
        </p>
        {filtered ? (
          <Button variant="quiet" onClick={() => onFiltersChange(defaultTableFilters)}>
            Clear filters
          </Button>
        ) : null}
      </div>

      {rows.length === 0 ? (
        <p className="rounded-card border border-dashed border-surface-line px-4 py-8 text-center text-ink-muted">
          No actions match these filters.
        </p>
      ) : (
        // Explicit roles keep the table's meaning for screen readers while phones restyle it.
        <div className="md:relative md:overflow-x-auto md:rounded-card md:border md:border-surface-line md:bg-surface">
          <table role="table" aria-label="Corrective actions" className="block w-full md:table">
            <SortableTableHead table={table} cellClassName="whitespace-nowrap" />
            <tbody role="rowgroup" className="flex flex-col gap-3 md:table-row-group">
              {rows.map((row) => (
                <tr
                  role="row"
                  key={row.id}
                  className={cn(
                    "grid grid-cols-2 gap-x-3 gap-y-1.5 rounded-card border border-surface-line bg-surface p-4 shadow-sm",
                    row.original.overdue && "border-l-8 border-l-verdict-not-ready md:border-l-0",
                    "md:table-row md:rounded-none md:border-0 md:bg-surface md:p-0 md:shadow-none",
                  )}
                >
                  {row.getVisibleCells().map((cell) => {
                    const id = cell.column.id;
                    const blankOnPhone =
                      (id === "overdue" && !row.original.overdue) ||
                      (id === "daysToClose" && row.original.daysToClose === null);
                    return (
                      <td
                        role="cell"
                        key={cell.id}
                        data-column={id}
                        className={cn(
                          "block min-w-0 text-sm md:table-cell md:border-b md:border-surface-line md:px-3 md:py-3 md:align-top md:text-base",
                          cellPlacement[id],
                          blankOnPhone && "max-md:hidden",
                        )}
                      >
                        {labelledOnPhone.has(id) ? (
                          <span className="text-ink-muted md:sr-only">
                            {String(cell.column.columnDef.header)}:{" "}
                          </span>
                        ) : null}
                        {flexRender(cell.column.columnDef.cell, cell.getContext())}
                      </td>
                    );
                  })}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
