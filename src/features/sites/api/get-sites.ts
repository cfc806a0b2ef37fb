import { type Site, siteListResponseSchema } from "@shared/schemas/site";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** The sites where the signed-in person holds a role (every site for network-wide roles). */
export async function getSites({ signal }: { signal?: AbortSignal } = {}): Promise<Site[]> {
  const { sites } = await apiRequest("/api/sites", { schema: siteListResponseSchema, signal });
  return sites;
}

export function sitesQueryOptions() {
  return queryOptions({
    queryKey: queryKeys.sites.list,
    queryFn: ({ signal }) => getSites({ signal }),
  });
}

export function useSites() {
  return useQuery(sitesQueryOptions());
}
