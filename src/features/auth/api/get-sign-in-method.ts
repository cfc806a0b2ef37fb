import {
  type SignInMethodBody,
  type SignInMethodResponse,
  signInMethodResponseSchema,
} from "@shared/schemas/identity-provider";
import { mutationOptions, useMutation } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { endPendingSignOut } from "./get-me";

/**
 * How this address signs in: through its network's provider, with a password, or both. Decided by
 * the address's domain alone; asked with POST so the address stays out of logs and caches.
 */
export async function getSignInMethod(body: SignInMethodBody): Promise<SignInMethodResponse> {
  // The previous person signed out with no signal: their session ends before this one begins.
  await endPendingSignOut().catch(() => undefined);
  return apiRequest("/api/auth/sign-in/method", {
    method: "POST",
    body,
    schema: signInMethodResponseSchema,
  });
}

export function signInMethodMutationOptions() {
  return mutationOptions({
    mutationKey: ["sessions", "sign-in-method"],
    mutationFn: getSignInMethod,
  });
}

export function useSignInMethod() {
  return useMutation(signInMethodMutationOptions());
}
