import type { DuePolicy } from "@shared/calc/due";
import { type DuePolicyResponse, duePolicyResponseSchema } from "@shared/schemas/actions";
import { useMutation, useQueryClient } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** New due times by severity; actions already open keep theirs. */
export function updateDuePolicy(siteId: string, policy: DuePolicy): Promise<DuePolicyResponse> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/due-policy`, {
    method: "PUT",
    body: policy,
    schema: duePolicyResponseSchema,
  });
}

export function useUpdateDuePolicy(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (policy: DuePolicy) => updateDuePolicy(siteId, policy),
    onSuccess: (reply) => queryClient.setQueryData(queryKeys.actions.duePolicy(siteId), reply),
  });
}
