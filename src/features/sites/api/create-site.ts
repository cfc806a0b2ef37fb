import { type CreateSiteBody, type Site, siteResponseSchema } from "@shared/schemas/site";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

export async function createSite(body: CreateSiteBody): Promise<Site> {
  const { site } = await apiRequest("/api/sites", {
    method: "POST",
    body,
    schema: siteResponseSchema,
  });
  return site;
}

export function createSiteMutationOptions(queryClient: QueryClient) {
  return mutationOptions({
    mutationKey: ["sites", "create"],
    mutationFn: createSite,
    onSuccess: (site) => {
      queryClient.setQueryData(queryKeys.sites.detail(site.id), site);
      return queryClient.invalidateQueries({ queryKey: queryKeys.sites.list });
    },
  });
}

export function useCreateSite() {
  const queryClient = useQueryClient();
  return useMutation(createSiteMutationOptions(queryClient));
}
