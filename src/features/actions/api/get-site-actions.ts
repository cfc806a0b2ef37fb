import {
  type ActionListQuery,
  actionListResponseSchema,
  type ActionSummary,
} from "@shared/schemas/actions";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

export type SiteActionFilters = Partial<ActionListQuery>;

/** The filters as the list and its CSV export both read them; empty ones are left out. */
export function actionFilterSearch(filters: SiteActionFilters): string {
  const search = new URLSearchParams();
  for (const name of ["state", "floorId", "spaceId", "severity", "overdue"] as const) {
    const value = filters[name];
    if (value) search.set(name, value);
  }
  const text = search.toString();
  return text ? `?${text}` : "";
}

/** A site's corrective actions: unfinished first, overdue first, then by due time. */
export async function getSiteActions(
  siteId: string,
  filters: SiteActionFilters = {},
  { signal }: { signal?: AbortSignal } = {},
): Promise<ActionSummary[]> {
  const { actions } = await apiRequest(
    `/api/sites/${encodeURIComponent(siteId)}/actions${actionFilterSearch(filters)}`,
    { schema: actionListResponseSchema, signal },
  );
  return actions;
}

export function siteActionsQueryOptions(siteId: string, filters: SiteActionFilters = {}) {
  return queryOptions({
    queryKey: queryKeys.actions.site(siteId, filters),
    queryFn: ({ signal }) => getSiteActions(siteId, filters, { signal }),
  });
}

export function useSiteActions(siteId: string, filters: SiteActionFilters = {}) {
  return useQuery(siteActionsQueryOptions(siteId, filters));
}
