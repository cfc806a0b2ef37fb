import { actionListResponseSchema, type ActionSummary } from "@shared/schemas/actions";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

export const myVerificationsQueryKey = ["actions", "to-verify"] as const;

/** Fixes sent for verification at the sites where the signed-in person audits. */
export async function getMyVerifications({ signal }: { signal?: AbortSignal } = {}): Promise<
  ActionSummary[]
> {
  const { actions } = await apiRequest("/api/my/verifications", {
    schema: actionListResponseSchema,
    signal,
  });
  return actions;
}

export function myVerificationsQueryOptions() {
  return queryOptions({
    queryKey: myVerificationsQueryKey,
    queryFn: ({ signal }) => getMyVerifications({ signal }),
  });
}

export function useMyVerifications() {
  return useQuery(myVerificationsQueryOptions());
}
