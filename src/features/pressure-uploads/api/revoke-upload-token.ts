import { type UploadToken, uploadTokenSchema } from "@shared/schemas/pressure-uploads";
import { useMutation, useQueryClient } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** Revokes a token: uploads with it are refused from now on. */
export function revokeUploadToken(siteId: string, tokenId: string): Promise<UploadToken> {
  return apiRequest(
    `/api/sites/${encodeURIComponent(siteId)}/pressure-upload-tokens/${encodeURIComponent(tokenId)}`,
    { method: "DELETE", schema: uploadTokenSchema },
  );
}

export function useRevokeUploadToken(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (tokenId: string) => revokeUploadToken(siteId, tokenId),
    onSuccess: () =>
      queryClient.invalidateQueries({ queryKey: queryKeys.pressureUploadTokens.site(siteId) }),
  });
}
