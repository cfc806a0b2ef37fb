import {
  type CreatedUploadToken,
  createdUploadTokenSchema,
} from "@shared/schemas/pressure-uploads";
import { useMutation, useQueryClient } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** Makes a token; the reply holds the token itself, which is never shown again. */
export function createUploadToken(siteId: string, name: string): Promise<CreatedUploadToken> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/pressure-upload-tokens`, {
    method: "POST",
    body: { name },
    schema: createdUploadTokenSchema,
  });
}

export function useCreateUploadToken(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (name: string) => createUploadToken(siteId, name),
    onSuccess: () =>
      queryClient.invalidateQueries({ queryKey: queryKeys.pressureUploadTokens.site(siteId) }),
  });
}
