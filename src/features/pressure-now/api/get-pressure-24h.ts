import { type Pressure24hResponse, pressure24hResponseSchema } from "@shared/schemas/pressure-site";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** A room's last 24 hours, a point a minute, with its min, mean, max and time out of range. */
export function getPressure24h(
  spaceId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<Pressure24hResponse> {
  return apiRequest(`/api/spaces/${encodeURIComponent(spaceId)}/pressure-24h`, {
    schema: pressure24hResponseSchema,
    signal,
  });
}

export function pressure24hQueryOptions(spaceId: string) {
  return queryOptions({
    queryKey: queryKeys.pressureNow.day(spaceId),
    queryFn: ({ signal }) => getPressure24h(spaceId, { signal }),
    staleTime: 60_000,
  });
}

export function usePressure24h(spaceId: string) {
  return useQuery(pressure24hQueryOptions(spaceId));
}
