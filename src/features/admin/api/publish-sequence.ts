import { type SequenceVersion, sequenceVersionSchema } from "@shared/schemas/observations";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";
import { z } from "zod";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

const publishedReplySchema = z.object({ published: sequenceVersionSchema });

/** Publishes the saved draft as the next version; observations started from now on use it. */
export async function publishSequence(key: string): Promise<SequenceVersion> {
  const { published } = await apiRequest(`/api/sequences/${encodeURIComponent(key)}/publish`, {
    method: "POST",
    schema: publishedReplySchema,
  });
  return published;
}

export function publishSequenceMutationOptions(queryClient: QueryClient, key: string) {
  return mutationOptions({
    mutationKey: ["sequences", "publish", key],
    mutationFn: () => publishSequence(key),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: queryKeys.sequences.list }),
  });
}

export function usePublishSequence(key: string) {
  const queryClient = useQueryClient();
  return useMutation(publishSequenceMutationOptions(queryClient, key));
}
