import { type Floor, floorsResponseSchema } from "@shared/schemas/floors";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** The site's floors, sorted by building and level. */
export async function getFloors(
  siteId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<Floor[]> {
  const { floors } = await apiRequest(`/api/sites/${encodeURIComponent(siteId)}/floors`, {
    schema: floorsResponseSchema,
    signal,
  });
  return floors;
}

export function floorsQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: queryKeys.floors.list(siteId),
    queryFn: ({ signal }) => getFloors(siteId, { signal }),
  });
}

export function useFloors(siteId: string) {
  return useQuery(floorsQueryOptions(siteId));
}
