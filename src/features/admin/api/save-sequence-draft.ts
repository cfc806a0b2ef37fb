import {
  type SequenceDraftBody,
  type SequenceVersion,
  sequenceVersionSchema,
} from "@shared/schemas/observations";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";
import { z } from "zod";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

const draftReplySchema = z.object({ sequence: sequenceVersionSchema });

/** Creates or replaces the sequence's draft (a new key makes a new sequence); order is the order. */
export async function saveSequenceDraft(
  key: string,
  body: SequenceDraftBody,
): Promise<SequenceVersion> {
  const { sequence } = await apiRequest(`/api/sequences/${encodeURIComponent(key)}/draft`, {
    method: "PUT",
    body,
    schema: draftReplySchema,
  });
  return sequence;
}

export function saveSequenceDraftMutationOptions(queryClient: QueryClient, key: string) {
  return mutationOptions({
    mutationKey: ["sequences", "draft", key],
    mutationFn: (body: SequenceDraftBody) => saveSequenceDraft(key, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: queryKeys.sequences.list }),
  });
}

export function useSaveSequenceDraft(key: string) {
  const queryClient = useQueryClient();
  return useMutation(saveSequenceDraftMutationOptions(queryClient, key));
}
