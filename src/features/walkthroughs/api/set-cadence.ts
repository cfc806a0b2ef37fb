import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** How often a space is audited, in days (site administrators). */
export async function setCadence(spaceId: string, cadenceDays: number): Promise<void> {
  await apiRequest(`/api/spaces/${encodeURIComponent(spaceId)}/cadence`, {
    method: "PATCH",
    body: { cadenceDays },
  });
}

export function setCadenceMutationOptions(queryClient: QueryClient, siteId: string) {
  return mutationOptions({
    mutationKey: ["schedules", "cadence", siteId],
    mutationFn: ({ spaceId, cadenceDays }: { spaceId: string; cadenceDays: number }) =>
      setCadence(spaceId, cadenceDays),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: queryKeys.schedules.site(siteId) }),
  });
}

export function useSetCadence(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation(setCadenceMutationOptions(queryClient, siteId));
}
