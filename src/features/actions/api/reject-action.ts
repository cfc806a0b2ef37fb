import { type ActionDetail, actionDetailSchema } from "@shared/schemas/actions";
import { useMutation, useQueryClient } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { storeMovedAction } from "./action-cache";

/** Awaiting verification → in progress; a new photo of the fix is then needed. */
export function rejectAction(actionId: string, reason: string): Promise<ActionDetail> {
  return apiRequest(`/api/actions/${encodeURIComponent(actionId)}/reject`, {
    method: "POST",
    body: { reason },
    schema: actionDetailSchema,
  });
}

export function useRejectAction(actionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (reason: string) => rejectAction(actionId, reason),
    onSuccess: (detail) => storeMovedAction(queryClient, detail),
  });
}
