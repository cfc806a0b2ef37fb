import { type MeResponse, meResponseSchema } from "@shared/schemas/auth";
import type { SetPasswordBody } from "@shared/schemas/people";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

import { rememberSignedInPerson } from "./get-me";

export function resetPassword(token: string, body: SetPasswordBody): Promise<MeResponse> {
  return apiRequest(`/api/auth/password-reset/${encodeURIComponent(token)}`, {
    method: "POST",
    body,
    schema: meResponseSchema,
  });
}

/** The new password signs the person in here and ends every other session they had. */
export function resetPasswordMutationOptions(queryClient: QueryClient, token: string) {
  return mutationOptions({
    mutationKey: ["password-resets", token, "complete"],
    mutationFn: (body: SetPasswordBody) => resetPassword(token, body),
    onSuccess: (me) =>
      rememberSignedInPerson(queryClient, me, queryKeys.passwordResets.detail(token)),
  });
}

export function useResetPassword(token: string) {
  const queryClient = useQueryClient();
  return useMutation(resetPasswordMutationOptions(queryClient, token));
}
