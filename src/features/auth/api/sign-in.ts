import { type MeResponse, meResponseSchema, type SignInBody } from "@shared/schemas/auth";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { endPendingSignOut, rememberSignedInPerson } from "./get-me";

export async function signIn(body: SignInBody): Promise<MeResponse> {
  // The previous person signed out with no signal: their session ends before this one begins.
  await endPendingSignOut().catch(() => undefined);
  return apiRequest("/api/auth/sign-in", { method: "POST", body, schema: meResponseSchema });
}

export function signInMutationOptions(queryClient: QueryClient) {
  return mutationOptions({
    mutationKey: ["sessions", "sign-in"],
    mutationFn: signIn,
    onSuccess: (me) => rememberSignedInPerson(queryClient, me),
  });
}

export function useSignIn() {
  const queryClient = useQueryClient();
  return useMutation(signInMutationOptions(queryClient));
}
