import {
  type IdentityProviderBody,
  type IdentityProviderResponse,
  type IdentityProviderSettings,
  identityProviderSettingsSchema,
} from "@shared/schemas/identity-provider";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";
import { z } from "zod";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

const savedSchema = z.object({ provider: identityProviderSettingsSchema });

/** Creates or changes the network's provider; a secret left out keeps the stored one. */
export async function saveIdentityProvider(
  body: IdentityProviderBody,
): Promise<IdentityProviderSettings> {
  const { provider } = await apiRequest("/api/admin/identity-provider", {
    method: "PUT",
    body,
    schema: savedSchema,
  });
  return provider;
}

export function saveIdentityProviderMutationOptions(queryClient: QueryClient) {
  return mutationOptions({
    mutationKey: ["identity-providers", "save"],
    mutationFn: saveIdentityProvider,
    onSuccess: (provider) => {
      queryClient.setQueryData<IdentityProviderResponse>(
        queryKeys.identityProviders.current,
        (current) =>
          current
            ? { ...current, provider }
            : {
                provider,
                redirectUri: provider.redirectUri,
                postLogoutRedirectUri: provider.postLogoutRedirectUri,
              },
      );
    },
  });
}

export function useSaveIdentityProvider() {
  const queryClient = useQueryClient();
  return useMutation(saveIdentityProviderMutationOptions(queryClient));
}
