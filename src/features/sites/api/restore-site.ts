import { retirementResultSchema } from "@shared/schemas/retirement";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

/** Restores a whole site with the floors and spaces retired with it (network-wide administrators). */
export async function restoreSite(siteId: string, reason?: string) {
  const { retirement } = await apiRequest(`/api/sites/${encodeURIComponent(siteId)}/restore`, {
    method: "POST",
    body: reason ? { reason } : {},
    schema: retirementResultSchema,
  });
  return retirement;
}

export function restoreSiteMutationOptions(queryClient: QueryClient) {
  return mutationOptions({
    mutationKey: ["sites", "restore"],
    mutationFn: (input: { siteId: string; reason?: string }) =>
      restoreSite(input.siteId, input.reason),
    // Site lists, floors, due lists and actions all change: refresh every cached read.
    // Not awaited: the refreshed list drops the row whose own success callback must still run.
    onSuccess: () => {
      void queryClient.invalidateQueries();
    },
  });
}

export function useRestoreSite() {
  const queryClient = useQueryClient();
  return useMutation(restoreSiteMutationOptions(queryClient));
}
