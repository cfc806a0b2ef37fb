import {
  type ConnectionTestResponse,
  connectionTestResponseSchema,
} from "@shared/schemas/identity-provider";
import { mutationOptions, useMutation } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

/** Tries the stored settings step by step: the address, discovery, then the client's credentials. */
export function testIdentityProvider(): Promise<ConnectionTestResponse> {
  return apiRequest("/api/admin/identity-provider/test", {
    method: "POST",
    schema: connectionTestResponseSchema,
  });
}

export function testIdentityProviderMutationOptions() {
  return mutationOptions({
    mutationKey: ["identity-providers", "test"],
    mutationFn: testIdentityProvider,
  });
}

export function useTestIdentityProvider() {
  return useMutation(testIdentityProviderMutationOptions());
}
