import { type ActionDetail, actionDetailSchema } from "@shared/schemas/actions";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** One corrective action with its findings, proof, place on the plan and every move. */
export function getAction(
  actionId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<ActionDetail> {
  return apiRequest(`/api/actions/${encodeURIComponent(actionId)}`, {
    schema: actionDetailSchema,
    signal,
  });
}

export function actionQueryOptions(actionId: string) {
  return queryOptions({
    queryKey: queryKeys.actions.detail(actionId),
    queryFn: ({ signal }) => getAction(actionId, { signal }),
  });
}

export function useAction(actionId: string) {
  return useQuery(actionQueryOptions(actionId));
}
