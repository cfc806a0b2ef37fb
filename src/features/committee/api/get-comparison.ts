import { type ComparisonResponse, comparisonResponseSchema } from "@shared/schemas/committee";
import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

import { apiSearch, type CommitteeView } from "../lib/committee-view";

/** Readiness and compliance by item group per site, with the chosen pair's difference. */
export async function getComparison(
  view: CommitteeView,
  { signal }: { signal?: AbortSignal } = {},
): Promise<ComparisonResponse> {
  return apiRequest(`/api/committee/comparison${apiSearch(view)}`, {
    schema: comparisonResponseSchema,
    signal,
  });
}

export function comparisonQueryOptions(view: CommitteeView) {
  return queryOptions({
    queryKey: queryKeys.committee.comparison(view),
    queryFn: ({ signal }) => getComparison(view, { signal }),
  });
}

export function useComparison(view: CommitteeView, { enabled = true } = {}) {
  // Changing a filter keeps the last figures on screen until the new ones arrive.
  return useQuery({ ...comparisonQueryOptions(view), enabled, placeholderData: keepPreviousData });
}
