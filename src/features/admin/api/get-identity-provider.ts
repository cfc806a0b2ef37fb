import {
  type IdentityProviderResponse,
  identityProviderResponseSchema,
} from "@shared/schemas/identity-provider";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** The network's identity provider (or none yet) and what to register at the provider. */
export function getIdentityProvider({
  signal,
}: { signal?: AbortSignal } = {}): Promise<IdentityProviderResponse> {
  return apiRequest("/api/admin/identity-provider", {
    schema: identityProviderResponseSchema,
    signal,
  });
}

export function identityProviderQueryOptions() {
  return queryOptions({
    queryKey: queryKeys.identityProviders.current,
    queryFn: ({ signal }) => getIdentityProvider({ signal }),
  });
}

export function useIdentityProvider() {
  return useQuery(identityProviderQueryOptions());
}
