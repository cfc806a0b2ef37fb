import { type RetiredSite, retiredSitesResponseSchema } from "@shared/schemas/retirement";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** The network's retired sites (network-wide administrators). */
export async function getRetiredSites({ signal }: { signal?: AbortSignal } = {}): Promise<
  RetiredSite[]
> {
  const { sites } = await apiRequest("/api/retired-sites", {
    schema: retiredSitesResponseSchema,
    signal,
  });
  return sites;
}

export function retiredSitesQueryOptions() {
  return queryOptions({
    queryKey: queryKeys.sites.retired,
    queryFn: ({ signal }) => getRetiredSites({ signal }),
  });
}

export function useRetiredSites(enabled = true) {
  return useQuery({ ...retiredSitesQueryOptions(), enabled });
}
