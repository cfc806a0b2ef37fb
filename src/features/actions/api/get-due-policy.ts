import { type DuePolicyResponse, duePolicyResponseSchema } from "@shared/schemas/actions";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** How long each severity has before its actions are due at this site. */
export function getDuePolicy(
  siteId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<DuePolicyResponse> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/due-policy`, {
    schema: duePolicyResponseSchema,
    signal,
  });
}

export function duePolicyQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: queryKeys.actions.duePolicy(siteId),
    queryFn: ({ signal }) => getDuePolicy(siteId, { signal }),
  });
}

export function useDuePolicy(siteId: string) {
  return useQuery(duePolicyQueryOptions(siteId));
}
