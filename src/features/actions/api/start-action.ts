import { type ActionDetail, actionDetailSchema } from "@shared/schemas/actions";
import { useMutation, useQueryClient } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { storeMovedAction } from "./action-cache";

/** Open → in progress: the facilities lead has begun the fix. */
export function startAction(actionId: string): Promise<ActionDetail> {
  return apiRequest(`/api/actions/${encodeURIComponent(actionId)}/start`, {
    method: "POST",
    schema: actionDetailSchema,
  });
}

export function useStartAction(actionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: () => startAction(actionId),
    onSuccess: (detail) => storeMovedAction(queryClient, detail),
  });
}
