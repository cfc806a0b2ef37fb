import { type SequencesResponse, sequencesResponseSchema } from "@shared/schemas/observations";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** Each sequence's published version and its draft, if one is being prepared. */
export function getSequences({
  signal,
}: { signal?: AbortSignal } = {}): Promise<SequencesResponse> {
  return apiRequest("/api/sequences", { schema: sequencesResponseSchema, signal });
}

export function sequencesQueryOptions() {
  return queryOptions({
    queryKey: queryKeys.sequences.list,
    queryFn: ({ signal }) => getSequences({ signal }),
  });
}

export function useSequences() {
  return useQuery(sequencesQueryOptions());
}
