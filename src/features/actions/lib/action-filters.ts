import { type Severity, severities } from "@shared/calc/verdict";
import type { ActionSummary } from "@shared/schemas/actions";

import type { SiteActionFilters } from "../api/get-site-actions";

/** Which actions a list shows: the unfinished ones, the done ones, or all. */
export type ActionListState = "unfinished" | "done" | "all";

export interface ActionTableFilters {
  state: ActionListState;
  severity: Severity | "";
  overdueOnly: boolean;
}

export const defaultTableFilters: ActionTableFilters = {
  state: "unfinished",
  severity: "",
  overdueOnly: false,
};

/** The filters read from a page address, so a filtered list can be shared or bookmarked. */
export function filtersFromSearch(search: URLSearchParams): ActionTableFilters {
  const state = search.get("state");
  const severity = search.get("severity");
  return {
    state: state === "done" || state === "all" ? state : "unfinished",
    severity: (severities as readonly string[]).includes(severity ?? "")
      ? (severity as Severity)
      : "",
    overdueOnly: search.get("overdue") === "true",
  };
}

export function filtersToSearch(filters: ActionTableFilters): URLSearchParams {
  const search = new URLSearchParams();
  if (filters.state !== defaultTableFilters.state) search.set("state", filters.state);
  if (filters.severity) search.set("severity", filters.severity);
  if (filters.overdueOnly) search.set("overdue", "true");
  return search;
}

/** The same filters as the server's list and export read them. */
export function filtersToQuery(filters: ActionTableFilters): SiteActionFilters {
  return {
    state: filters.state,
    ...(filters.severity ? { severity: filters.severity } : {}),
    ...(filters.overdueOnly ? { overdue: "true" as const } : {}),
  };
}

export function matchesState(
  action: Pick<ActionSummary, "state">,
  state: ActionListState,
): boolean {
  if (state === "all") return true;
  return state === "done" ? action.state === "done" : action.state !== "done";
}

export interface PinFilter {
  severities: ReadonlySet<Severity>;
  overdueOnly: boolean;
}

export const showAllPins: PinFilter = { severities: new Set(severities), overdueOnly: false };

export function applyPinFilter(
  actions: readonly ActionSummary[],
  filter: PinFilter,
): ActionSummary[] {
  return actions.filter(
    (action) => filter.severities.has(action.severity) && (!filter.overdueOnly || action.overdue),
  );
}
