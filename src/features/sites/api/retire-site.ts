import { retirementResultSchema } from "@shared/schemas/retirement";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

/** Retires a whole site with its floors and spaces (network-wide administrators). */
export async function retireSite(siteId: string, reason?: string) {
  const { retirement } = await apiRequest(`/api/sites/${encodeURIComponent(siteId)}/retire`, {
    method: "POST",
    body: reason ? { reason } : {},
    schema: retirementResultSchema,
  });
  return retirement;
}

export function retireSiteMutationOptions(queryClient: QueryClient) {
  return mutationOptions({
    mutationKey: ["sites", "retire"],
    mutationFn: (input: { siteId: string; reason?: string }) =>
      retireSite(input.siteId, input.reason),
    // Site lists, floors, due lists and actions all change: refresh every cached read.
    // Not awaited: the refreshed list drops the row whose own success callback must still run.
    onSuccess: () => {
      void queryClient.invalidateQueries();
    },
  });
}

export function useRetireSite() {
  const queryClient = useQueryClient();
  return useMutation(retireSiteMutationOptions(queryClient));
}
