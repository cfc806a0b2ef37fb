import { type UploadTokenList, uploadTokenListSchema } from "@shared/schemas/pressure-uploads";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** The site's pressure upload tokens (names and dates; never the tokens themselves). */
export function getUploadTokens(
  siteId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<UploadTokenList> {
  return apiRequest(`/api/sites/${encodeURIComponent(siteId)}/pressure-upload-tokens`, {
    schema: uploadTokenListSchema,
    signal,
  });
}

export function uploadTokensQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: queryKeys.pressureUploadTokens.site(siteId),
    queryFn: ({ signal }) => getUploadTokens(siteId, { signal }),
  });
}

export function useUploadTokens(siteId: string) {
  return useQuery(uploadTokensQueryOptions(siteId));
}
