import {
  type ObservationSettings,
  type ObservationSettingsBody,
  observationSettingsSchema,
} from "@shared/schemas/observations";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

export async function saveObservationSettings(
  body: ObservationSettingsBody,
): Promise<ObservationSettings> {
  return apiRequest("/api/observation-settings", {
    method: "PUT",
    body,
    schema: observationSettingsSchema,
  });
}

export function saveObservationSettingsMutationOptions(queryClient: QueryClient) {
  return mutationOptions({
    mutationKey: ["observation-settings", "save"],
    mutationFn: saveObservationSettings,
    onSuccess: (saved) => queryClient.setQueryData(queryKeys.observationSettings.current, saved),
  });
}

export function useSaveObservationSettings() {
  const queryClient = useQueryClient();
  return useMutation(saveObservationSettingsMutationOptions(queryClient));
}
