import type { PasswordResetRequest } from "@shared/schemas/people";
import { mutationOptions, useMutation } from "@tanstack/react-query";
import { z } from "zod";

import { apiRequest } from "@/lib/api-client";

const passwordResetRequestedSchema = z.object({ message: z.string() });

/** The answer is the same whether or not the address has an account, so it reveals nothing. */
export async function requestPasswordReset(body: PasswordResetRequest): Promise<string> {
  const { message } = await apiRequest("/api/auth/password-reset", {
    method: "POST",
    body,
    schema: passwordResetRequestedSchema,
  });
  return message;
}

export function requestPasswordResetMutationOptions() {
  return mutationOptions({
    mutationKey: ["password-resets", "request"],
    mutationFn: requestPasswordReset,
  });
}

export function useRequestPasswordReset() {
  return useMutation(requestPasswordResetMutationOptions());
}
