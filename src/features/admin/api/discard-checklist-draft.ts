import type { ZoneType } from "@shared/zones";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

export async function discardChecklistDraft(zoneType: ZoneType): Promise<void> {
  await apiRequest(`/api/checklists/${encodeURIComponent(zoneType)}/draft`, { method: "DELETE" });
}

export function discardChecklistDraftMutationOptions(queryClient: QueryClient, zoneType: ZoneType) {
  return mutationOptions({
    mutationKey: ["checklists", "discard", zoneType],
    mutationFn: () => discardChecklistDraft(zoneType),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: queryKeys.checklists.list }),
  });
}

export function useDiscardChecklistDraft(zoneType: ZoneType) {
  const queryClient = useQueryClient();
  return useMutation(discardChecklistDraftMutationOptions(queryClient, zoneType));
}
