import { type ObservationSettings, observationSettingsSchema } from "@shared/schemas/observations";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** How long the network keeps the detail of each observation. */
export function getObservationSettings({
  signal,
}: { signal?: AbortSignal } = {}): Promise<ObservationSettings> {
  return apiRequest("/api/observation-settings", { schema: observationSettingsSchema, signal });
}

export function observationSettingsQueryOptions() {
  return queryOptions({
    queryKey: queryKeys.observationSettings.current,
    queryFn: ({ signal }) => getObservationSettings({ signal }),
  });
}

export function useObservationSettings() {
  return useQuery(observationSettingsQueryOptions());
}
