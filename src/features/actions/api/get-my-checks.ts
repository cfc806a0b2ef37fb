import { actionListResponseSchema, type ActionSummary } from "@shared/schemas/actions";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** Fixes to check at the sites where the signed-in person audits. */
export async function getMyChecks({ signal }: { signal?: AbortSignal } = {}): Promise<
  ActionSummary[]
> {
  const { actions } = await apiRequest("/api/my/checks", {
    schema: actionListResponseSchema,
    signal,
  });
  return actions;
}

export function myChecksQueryOptions() {
  return queryOptions({
    queryKey: queryKeys.actions.toCheck,
    queryFn: ({ signal }) => getMyChecks({ signal }),
  });
}

export function useMyChecks() {
  return useQuery(myChecksQueryOptions());
}
