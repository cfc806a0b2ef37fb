import type { ChangePasswordBody } from "@shared/schemas/people";
import { mutationOptions, useMutation } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

/** Changes the password; the server signs out every other session of this person. */
export function changePassword(body: ChangePasswordBody): Promise<undefined> {
  return apiRequest("/api/auth/me/password", { method: "POST", body });
}

export function changePasswordMutationOptions() {
  return mutationOptions({
    mutationKey: ["sessions", "me", "password"],
    mutationFn: changePassword,
  });
}

export function useChangePassword() {
  return useMutation(changePasswordMutationOptions());
}
