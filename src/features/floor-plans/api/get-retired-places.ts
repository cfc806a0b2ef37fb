import { type RetiredPlaces, retiredPlacesResponseSchema } from "@shared/schemas/retirement";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** The site's retired floors and spaces (administrators). */
export async function getRetiredPlaces(
  siteId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<RetiredPlaces> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/retired`, {
    schema: retiredPlacesResponseSchema,
    signal,
  });
}

export function retiredPlacesQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: queryKeys.floors.retired(siteId),
    queryFn: ({ signal }) => getRetiredPlaces(siteId, { signal }),
  });
}

export function useRetiredPlaces(siteId: string, enabled = true) {
  return useQuery({ ...retiredPlacesQueryOptions(siteId), enabled });
}
