import {
  type PressureSettingsResponse,
  pressureSettingsResponseSchema,
} from "@shared/schemas/pressure-alarms";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** The site's room-pressure alarm graces, action limit and recipients. */
export function getPressureSettings(
  siteId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<PressureSettingsResponse> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/pressure-settings`, {
    schema: pressureSettingsResponseSchema,
    signal,
  });
}

export function pressureSettingsQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: queryKeys.pressureSettings.site(siteId),
    queryFn: ({ signal }) => getPressureSettings(siteId, { signal }),
  });
}

export function usePressureSettings(siteId: string) {
  return useQuery(pressureSettingsQueryOptions(siteId));
}
