import {
  type MonitorMappingBody,
  monitorMappingResponseSchema,
  type PressureMonitor,
} from "@shared/schemas/pressure-space";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** Maps a monitor to an isolation room, or changes its id or threshold. */
export async function mapMonitor(
  spaceId: string,
  body: MonitorMappingBody,
): Promise<PressureMonitor> {
  const { monitor } = await apiRequest(`/api/spaces/${encodeURIComponent(spaceId)}/monitor`, {
    method: "PUT",
    body,
    schema: monitorMappingResponseSchema,
  });
  return monitor;
}

export function mapMonitorMutationOptions(queryClient: QueryClient, spaceId: string) {
  return mutationOptions({
    mutationKey: ["room-pressures", "map", spaceId],
    mutationFn: (body: MonitorMappingBody) => mapMonitor(spaceId, body),
    onSuccess: () =>
      queryClient.invalidateQueries({ queryKey: queryKeys.roomPressures.space(spaceId) }),
  });
}

export function useMapMonitor(spaceId: string) {
  const queryClient = useQueryClient();
  return useMutation(mapMonitorMutationOptions(queryClient, spaceId));
}
