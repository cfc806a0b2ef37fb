import { type ActionDetail, actionDetailSchema } from "@shared/schemas/actions";
import { useMutation, useQueryClient } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { storeMovedAction } from "./action-cache";

/** Closed → in progress; the action keeps its history and original due time. */
export function reopenAction(actionId: string, reason: string): Promise<ActionDetail> {
  return apiRequest(`/api/actions/${encodeURIComponent(actionId)}/reopen`, {
    method: "POST",
    body: { reason },
    schema: actionDetailSchema,
  });
}

export function useReopenAction(actionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (reason: string) => reopenAction(actionId, reason),
    onSuccess: (detail) => storeMovedAction(queryClient, detail),
  });
}
