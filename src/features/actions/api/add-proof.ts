import { type ActionDetail, actionDetailSchema } from "@shared/schemas/actions";
import { useMutation, useQueryClient } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { mayResendUpload } from "../lib/proof-ids";
import { storeMovedAction } from "./action-cache";

export interface ProofUpload {
  /** Made on the phone; the same upload sent again under it is stored once. */
  id: string;
  file: File;
}

/** Attaches a photo of the fix (multipart: `id`, then the picture in `photo`). */
export function addProof(actionId: string, upload: ProofUpload): Promise<ActionDetail> {
  const form = new FormData();
  form.append("id", upload.id);
  form.append("photo", upload.file, upload.file.name || "proof.jpg");
  return apiRequest(`/api/actions/${encodeURIComponent(actionId)}/proofs`, {
    method: "POST",
    body: form,
    schema: actionDetailSchema,
  });
}

/** While a photo of the fix uploads, the page holds back asking for a check. */
export const addProofMutationKey = (actionId: string) => ["actions", "proof", actionId] as const;

const resends = 2;

export function useAddProof(actionId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationKey: addProofMutationKey(actionId),
    mutationFn: (upload: ProofUpload) => addProof(actionId, upload),
    // Sent again under the same id, so a reply lost on a weak signal never makes a second proof.
    retry: (failures, error) => failures < resends && mayResendUpload(error),
    retryDelay: (attempt) => 300 * 2 ** attempt,
    onSuccess: (detail) => storeMovedAction(queryClient, detail),
  });
}
