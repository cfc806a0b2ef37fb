import { type ActionDetail, actionDetailSchema } from "@shared/schemas/actions";
import { useMutation, useQueryClient } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { storeMovedAction } from "./action-cache";

/** Gives the action to another facilities lead of the site. */
export function assignAction(actionId: string, assigneeId: string): Promise<ActionDetail> {
  return apiRequest(`/api/actions/${encodeURIComponent(actionId)}/assignee`, {
    method: "PUT",
    body: { assigneeId },
    schema: actionDetailSchema,
  });
}

export function useAssignAction(actionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (assigneeId: string) => assignAction(actionId, assigneeId),
    onSuccess: (detail) => storeMovedAction(queryClient, detail),
  });
}
