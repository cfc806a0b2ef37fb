import { type PressureNowResponse, pressureNowResponseSchema } from "@shared/schemas/pressure-site";
import { queryOptions, useQueries, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** How often a screen showing live pressure asks again while it is open. */
export const pressureRefreshMs = 30_000;

/** Each monitored room of the site: its state now and any open alarm. */
export function getPressureNow(
  siteId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<PressureNowResponse> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/pressure-now`, {
    schema: pressureNowResponseSchema,
    signal,
  });
}

export function pressureNowQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: queryKeys.pressureNow.site(siteId),
    queryFn: ({ signal }) => getPressureNow(siteId, { signal }),
    refetchInterval: pressureRefreshMs,
  });
}

export function usePressureNow(siteId: string) {
  return useQuery(pressureNowQueryOptions(siteId));
}

/** The same for several sites at once (home: every site where the person holds a role). */
export function usePressureNowAt(siteIds: readonly string[]) {
  return useQueries({
    queries: siteIds.map((siteId) => pressureNowQueryOptions(siteId)),
    combine: (results) => ({
      sites: results.flatMap((result) => (result.data ? [result.data] : [])),
      failed: results.some((result) => result.isError),
    }),
  });
}
