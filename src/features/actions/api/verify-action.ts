import { type ActionDetail, actionDetailSchema } from "@shared/schemas/actions";
import { useMutation, useQueryClient } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { storeMovedAction } from "./action-cache";

/** Awaiting verification → closed: an auditor saw the fix. */
export function verifyAction(actionId: string, note: string): Promise<ActionDetail> {
  return apiRequest(`/api/actions/${encodeURIComponent(actionId)}/verify`, {
    method: "POST",
    body: { note },
    schema: actionDetailSchema,
  });
}

export function useVerifyAction(actionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (note: string) => verifyAction(actionId, note),
    onSuccess: (detail) => storeMovedAction(queryClient, detail),
  });
}
