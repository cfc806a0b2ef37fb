import { actionListResponseSchema, type ActionSummary } from "@shared/schemas/actions";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

export const myActionsQueryKey = ["actions", "mine"] as const;

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
    queryKey: myActionsQueryKey,
    queryFn: ({ signal }) => getMyActions({ signal }),
  });
}

export function useMyActions() {
  return useQuery(myActionsQueryOptions());
}
