import { actionListResponseSchema, type ActionSummary } from "@shared/schemas/actions";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** The unfinished actions the signed-in person owns, overdue first. */
export async function getMyActions({ signal }: { signal?: AbortSignal } = {}): Promise<
  ActionSummary[]
> {
  const { actions } = await apiRequest("/api/my/actions", {
    schema: actionListResponseSchema,
    signal,
  });
  return actions;
}

export function myActionsQueryOptions() {
  return queryOptions({
    queryKey: queryKeys.actions.mine,
    queryFn: ({ signal }) => getMyActions({ signal }),
  });
}

export function useMyActions() {
  return useQuery(myActionsQueryOptions());
}
