import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

export async function discardSequenceDraft(key: string): Promise<void> {
  await apiRequest(`/api/sequences/${encodeURIComponent(key)}/draft`, { method: "DELETE" });
}

export function discardSequenceDraftMutationOptions(queryClient: QueryClient, key: string) {
  return mutationOptions({
    mutationKey: ["sequences", "discard", key],
    mutationFn: () => discardSequenceDraft(key),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: queryKeys.sequences.list }),
  });
}

export function useDiscardSequenceDraft(key: string) {
  const queryClient = useQueryClient();
  return useMutation(discardSequenceDraftMutationOptions(queryClient, key));
}
