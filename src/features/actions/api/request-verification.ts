import { type ActionDetail, actionDetailSchema } from "@shared/schemas/actions";
import { useMutation, useQueryClient } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { storeMovedAction } from "./action-cache";

/** In progress → awaiting verification; needs a photo of this attempt and a note. */
export function requestVerification(actionId: string, note: string): Promise<ActionDetail> {
  return apiRequest(`/api/actions/${encodeURIComponent(actionId)}/verification-request`, {
    method: "POST",
    body: { note },
    schema: actionDetailSchema,
  });
}

export function useRequestVerification(actionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (note: string) => requestVerification(actionId, note),
    onSuccess: (detail) => storeMovedAction(queryClient, detail),
  });
}
