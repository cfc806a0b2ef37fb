import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** Takes the monitor off the room. */
export async function unmapMonitor(spaceId: string): Promise<void> {
  await apiRequest(`/api/spaces/${encodeURIComponent(spaceId)}/monitor`, { method: "DELETE" });
}

export function unmapMonitorMutationOptions(queryClient: QueryClient, spaceId: string) {
  return mutationOptions({
    mutationKey: ["room-pressures", "unmap", spaceId],
    mutationFn: () => unmapMonitor(spaceId),
    onSuccess: () =>
      queryClient.invalidateQueries({ queryKey: queryKeys.roomPressures.space(spaceId) }),
  });
}

export function useUnmapMonitor(spaceId: string) {
  const queryClient = useQueryClient();
  return useMutation(unmapMonitorMutationOptions(queryClient, spaceId));
}
