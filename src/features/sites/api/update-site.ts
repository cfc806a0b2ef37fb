import { type Site, siteResponseSchema, type UpdateSiteBody } from "@shared/schemas/site";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

export async function updateSite(siteId: string, body: UpdateSiteBody): Promise<Site> {
  const { site } = await apiRequest(`/api/sites/${encodeURIComponent(siteId)}`, {
    method: "PATCH",
    body,
    schema: siteResponseSchema,
  });
  return site;
}

export function updateSiteMutationOptions(queryClient: QueryClient, siteId: string) {
  return mutationOptions({
    mutationKey: ["sites", "update", siteId],
    mutationFn: (body: UpdateSiteBody) => updateSite(siteId, body),
    onSuccess: (site) => {
      queryClient.setQueryData(queryKeys.sites.detail(site.id), site);
      return queryClient.invalidateQueries({ queryKey: queryKeys.sites.list });
    },
  });
}

export function useUpdateSite(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation(updateSiteMutationOptions(queryClient, siteId));
}
