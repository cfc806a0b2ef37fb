import { type Site, siteResponseSchema } from "@shared/schemas/site";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

export async function getSite(
  siteId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<Site> {
  const { site } = await apiRequest(`/api/sites/${encodeURIComponent(siteId)}`, {
    schema: siteResponseSchema,
    signal,
  });
  return site;
}

export function siteQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: queryKeys.sites.detail(siteId),
    queryFn: ({ signal }) => getSite(siteId, { signal }),
  });
}

export function useSite(siteId: string) {
  return useQuery(siteQueryOptions(siteId));
}
