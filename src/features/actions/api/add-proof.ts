import { type ActionDetail, actionDetailSchema } from "@shared/schemas/actions";
import { useMutation, useQueryClient } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { storeMovedAction } from "./action-cache";

/** Attaches a photo of the fix (multipart field `photo`). */
export function addProof(actionId: string, file: File): Promise<ActionDetail> {
  const form = new FormData();
  form.append("photo", file, file.name || "proof.jpg");
  return apiRequest(`/api/actions/${encodeURIComponent(actionId)}/proofs`, {
    method: "POST",
    body: form,
    schema: actionDetailSchema,
  });
}

/** While a proof photo uploads, the page holds back sending for verification. */
export const addProofMutationKey = (actionId: string) => ["actions", "proof", actionId] as const;

export function useAddProof(actionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: addProofMutationKey(actionId),
    mutationFn: (file: File) => addProof(actionId, file),
    onSuccess: (detail) => storeMovedAction(queryClient, detail),
  });
}
