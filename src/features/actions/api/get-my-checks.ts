import { actionListResponseSchema, type ActionSummary } from "@shared/schemas/actions";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

export const myChecksQueryKey = ["actions", "to-check"] as const;

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
    queryKey: myChecksQueryKey,
    queryFn: ({ signal }) => getMyChecks({ signal }),
  });
}

export function useMyChecks() {
  return useQuery(myChecksQueryOptions());
}
