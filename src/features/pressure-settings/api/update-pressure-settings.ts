import {
  type PressureSettingsBody,
  type PressureSettingsResponse,
  pressureSettingsResponseSchema,
} from "@shared/schemas/pressure-alarms";
import { useMutation, useQueryClient } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

export function updatePressureSettings(
  siteId: string,
  body: PressureSettingsBody,
): Promise<PressureSettingsResponse> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/pressure-settings`, {
    method: "PUT",
    body,
    schema: pressureSettingsResponseSchema,
  });
}

export function useUpdatePressureSettings(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: PressureSettingsBody) => updatePressureSettings(siteId, body),
    onSuccess: (reply) => queryClient.setQueryData(queryKeys.pressureSettings.site(siteId), reply),
  });
}
