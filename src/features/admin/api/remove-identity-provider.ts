import type { IdentityProviderResponse } from "@shared/schemas/identity-provider";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** Ends sign-in through the provider; its people sign in with a password again. */
export async function removeIdentityProvider(): Promise<void> {
  await apiRequest("/api/admin/identity-provider", { method: "DELETE" });
}

export function removeIdentityProviderMutationOptions(queryClient: QueryClient) {
  return mutationOptions({
    mutationKey: ["identity-providers", "remove"],
    mutationFn: removeIdentityProvider,
    onSuccess: () => {
      queryClient.setQueryData<IdentityProviderResponse>(
        queryKeys.identityProviders.current,
        (current) => (current ? { ...current, provider: null } : current),
      );
      void queryClient.invalidateQueries({ queryKey: queryKeys.identityProviders.current });
    },
  });
}

export function useRemoveIdentityProvider() {
  const queryClient = useQueryClient();
  return useMutation(removeIdentityProviderMutationOptions(queryClient));
}
