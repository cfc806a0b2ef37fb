import { roleLabels } from "@shared/roles";
import { type Person, type PersonStatus, personStatuses } from "@shared/schemas/people";
import {
  type ColumnFiltersState,
  createColumnHelper,
  type FilterFn,
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getSortedRowModel,
  type SortingState,
  useReactTable,
} from "@tanstack/react-table";
import { useMemo, useState } from "react";
import { Link } from "react-router-dom";

import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/select-field";
import { SortableTableHead } from "@/components/ui/sortable-table-head";
import { TextField } from "@/components/ui/text-field";
import { linkStyles } from "@/components/ui/text-link";
import { paths } from "@/config/paths";
import { cn } from "@/lib/cn";

import {
  grantSiteLabel,
  type ManageableSite,
  networkWideValue,
  roleOptions,
} from "./grant-options";
import { PersonStatusBadge, statusLabels } from "./person-status-badge";

interface GrantFilter {
  role: string;
  site: string;
}

/**
 * One grant must match both the role and the site asked for. A network-wide grant counts at
 * every site, because that is where the person may act.
 */
const grantFilter: FilterFn<Person> = (row, columnId, filter: GrantFilter) =>
  row
    .getValue<Person["grants"]>(columnId)
    .some(
      (grant) =>
        (filter.role === "" || grant.role === filter.role) &&
        (filter.site === "" ||
          grant.siteId === null ||
          (filter.site !== networkWideValue && grant.siteId === filter.site)),
    );
grantFilter.autoRemove = (filter?: GrantFilter) => !filter || (!filter.role && !filter.site);

const column = createColumnHelper<Person>();

const columns = [
  column.accessor("name", {
    header: "Name",
    cell: (info) => (
      <Link
        to={paths.person.getHref(info.row.original.id)}
        className={cn(linkStyles, "text-lg md:text-base")}
      >
        {info.getValue()}
      </Link>
    ),
  }),
  column.accessor("email", {
    header: "E-mail",
    cell: (info) => (
      <span className="wrap-anywhere text-ink-muted md:text-ink">{info.getValue()}</span>
    ),
  }),
  column.accessor("grants", {
    id: "roles",
    header: "Roles",
    enableSorting: false,
    enableGlobalFilter: false,
    filterFn: grantFilter,
    cell: (info) => {
      const grants = info.getValue();
      if (grants.length === 0) return <span className="text-ink-muted">No roles</span>;
      return (
        <ul className="flex flex-col gap-0.5">
          {grants.map((grant) => (
            <li key={grant.id}>
              <span className="font-semibold">{roleLabels[grant.role]}</span>
              <span className="text-ink-muted"> · {grantSiteLabel(grant)}</span>
            </li>
          ))}
        </ul>
      );
    },
  }),
  column.accessor("status", {
    header: "Status",
    enableGlobalFilter: false,
    filterFn: "equals",
    cell: (info) => <PersonStatusBadge status={info.getValue()} />,
  }),
];

// On phones each row becomes a card: name and status on top, e-mail and roles below.
const cellPlacement: Record<string, string> = {
  name: "col-start-1 row-start-1 self-center",
  status: "col-start-2 row-start-1 justify-self-end",
  email: "col-span-2",
  roles: "col-span-2 pt-1",
};

const statusOptions = personStatuses.map((status) => ({
  value: status,
  label: statusLabels[status],
}));

export interface PeopleTableProps {
  people: readonly Person[];
  /** Sites the caller manages; sites named in the people's roles are added to the filter. */
  manageableSites: readonly ManageableSite[];
}

export function PeopleTable({ people, manageableSites }: PeopleTableProps) {
  const [search, setSearch] = useState("");
  const [site, setSite] = useState("");
  const [role, setRole] = useState("");
  const [status, setStatus] = useState<PersonStatus | "">("");
  const [sorting, setSorting] = useState<SortingState>([{ id: "name", desc: false }]);

  const data = useMemo(() => [...people], [people]);
  const siteFilterOptions = useMemo(() => {
    const byId = new Map(manageableSites.map((s) => [s.id, s.name]));
    for (const person of people) {
      for (const grant of person.grants) {
        if (grant.siteId && grant.siteName) byId.set(grant.siteId, grant.siteName);
      }
    }
    const sites = [...byId]
      .map(([value, label]) => ({ value, label }))
      .sort((a, b) => a.label.localeCompare(b.label));
    return [{ value: networkWideValue, label: "Network-wide roles only" }, ...sites];
  }, [people, manageableSites]);

  const columnFilters = useMemo<ColumnFiltersState>(() => {
    const filters: ColumnFiltersState = [];
    if (role || site) filters.push({ id: "roles", value: { role, site } satisfies GrantFilter });
    if (status) filters.push({ id: "status", value: status });
    return filters;
  }, [role, site, status]);

  // The table's API returns fresh functions on every render, which the compiler cannot memoise.
  // eslint-disable-next-line react-hooks/incompatible-library
  const table = useReactTable({
    data,
    columns,
    state: { globalFilter: search.trim(), columnFilters, sorting },
    globalFilterFn: "includesString",
    onSortingChange: setSorting,
    getRowId: (person) => person.id,
    getCoreRowModel: getCoreRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getSortedRowModel: getSortedRowModel(),
  });

  const rows = table.getRowModel().rows;
  const filtered = Boolean(search.trim() || site || role || status);
  const clearFilters = () => {
    setSearch("");
    setSite("");
    setRole("");
    setStatus("");
  };

  return (
    <div className="flex flex-col gap-4">
      <div
        role="search"
        aria-label="Find people"
        className="grid grid-cols-2 gap-3 rounded-card border border-surface-line bg-surface p-4 lg:grid-cols-4"
      >
        <TextField
          label="Search people"
          type="search"
          autoComplete="off"
          spellCheck={false}
          placeholder="Name or e-mail"
          value={search}
          onChange={(event) => setSearch(event.target.value)}
          className="col-span-2 lg:col-span-1"
        />
        <SelectField
          label="Site"
          placeholder="Any site"
          options={siteFilterOptions}
          value={site}
          onChange={(event) => setSite(event.target.value)}
          className="col-span-2 lg:col-span-1"
        />
        <SelectField
          label="Role"
          placeholder="Any role"
          options={roleOptions}
          value={role}
          onChange={(event) => setRole(event.target.value)}
        />
        <SelectField
          label="Status"
          placeholder="Any status"
          options={statusOptions}
          value={status}
          onChange={(event) => setStatus(event.target.value as PersonStatus | "")}
        />
      </div>

      <div className="flex flex-wrap items-center justify-between gap-2">
        <p aria-live="polite" className="text-sm text-ink-muted">
          {filtered
            ? `Showing ${rows.length} of ${people.length} ${people.length === 1 ? "person" : "people"}`
            : `${people.length} ${people.length === 1 ? "person" : "people"}`}
        </p>
        {filtered ? (
          <Button variant="quiet" onClick={clearFilters}>
            Clear filters
          </Button>
        ) : null}
      </div>

      {rows.length === 0 ? (
        <p className="rounded-card border border-dashed border-surface-line px-4 py-8 text-center text-ink-muted">
          No one matches these filters.
        </p>
      ) : (
        // Explicit roles keep the table's meaning for screen readers while phones restyle it.
        <div className="md:relative md:overflow-x-auto md:rounded-card md:border md:border-surface-line md:bg-surface">
          <table role="table" aria-label="People" className="block w-full md:table">
            <SortableTableHead table={table} cellClassName="px-4" />
            <tbody role="rowgroup" className="flex flex-col gap-3 md:table-row-group">
              {rows.map((row) => (
                <tr
                  role="row"
                  key={row.id}
                  className={cn(
                    "grid grid-cols-[1fr_auto] gap-x-3 gap-y-1 rounded-card border border-surface-line bg-surface p-4 shadow-sm",
                    "md:table-row md:rounded-none md:border-0 md:bg-surface md:p-0 md:shadow-none",
                  )}
                >
                  {row.getVisibleCells().map((cell) => (
                    <td
                      role="cell"
                      key={cell.id}
                      className={cn(
                        "block min-w-0 md:table-cell md:border-b md:border-surface-line md:px-4 md:py-3 md:align-top",
                        cellPlacement[cell.column.id],
                      )}
                    >
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
    </div>
  );
}
