import { type TrendsResponse, trendsResponseSchema } from "@shared/schemas/committee";
import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

import { apiSearch, type CommitteePeriod } from "../lib/committee-view";

/** Monthly p-charts per site, unclosed and overdue actions by age, median days to close. */
export async function getTrends(
  period: CommitteePeriod,
  { signal }: { signal?: AbortSignal } = {},
): Promise<TrendsResponse> {
  return apiRequest(`/api/committee/trends${apiSearch(period)}`, {
    schema: trendsResponseSchema,
    signal,
  });
}

export function trendsQueryOptions(period: CommitteePeriod) {
  return queryOptions({
    queryKey: queryKeys.committee.trends(period),
    queryFn: ({ signal }) => getTrends(period, { signal }),
  });
}

export function useTrends(period: CommitteePeriod, { enabled = true } = {}) {
  return useQuery({ ...trendsQueryOptions(period), enabled, placeholderData: keepPreviousData });
}
