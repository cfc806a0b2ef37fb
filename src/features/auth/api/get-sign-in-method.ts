import type { SignInMethodBody, SignInMethodResponse } from "@shared/schemas/identity-provider";
import { mutationOptions, useMutation } from "@tanstack/react-query";
import { z } from "zod";

import { apiRequest } from "@/lib/api-client";

import { endPendingSignOut } from "./get-me";

/**
 * The contract's reply, read with the validation the sign-in page already loads: the contract's
 * own module would be one more file on the page every phone opens first. The type ties it to the
 * contract (`signInMethodResponseSchema`).
 */
const methodReplySchema = z.object({
  password: z.boolean(),
  provider: z.object({ name: z.string(), startUrl: z.string() }).nullable(),
}) satisfies z.ZodType<SignInMethodResponse>;

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
    schema: methodReplySchema,
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
