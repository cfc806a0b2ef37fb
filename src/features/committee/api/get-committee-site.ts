import { type SiteDrillDown, siteDrillDownSchema } from "@shared/schemas/committee";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

import { apiSearch, type CommitteePeriod } from "../lib/committee-view";

/** One site's spaces in the period: readiness, latest verdict, open and overdue actions. */
export async function getCommitteeSite(
  siteId: string,
  period: CommitteePeriod,
  { signal }: { signal?: AbortSignal } = {},
): Promise<SiteDrillDown> {
  return apiRequest(`/api/committee/sites/${encodeURIComponent(siteId)}${apiSearch(period)}`, {
    schema: siteDrillDownSchema,
    signal,
  });
}

export function committeeSiteQueryOptions(siteId: string, period: CommitteePeriod) {
  return queryOptions({
    queryKey: queryKeys.committee.site(siteId, period),
    queryFn: ({ signal }) => getCommitteeSite(siteId, period, { signal }),
  });
}

export function useCommitteeSite(siteId: string, period: CommitteePeriod, { enabled = true } = {}) {
  return useQuery({ ...committeeSiteQueryOptions(siteId, period), enabled });
}
