import { passwordResetInfoSchema } from "@shared/schemas/people";
import { queryOptions, useQuery } from "@tanstack/react-query";
import type { z } from "zod";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

export type PasswordResetInfo = z.infer<typeof passwordResetInfoSchema>;

/** Which account a reset link is for; fails with `link_invalid` once used, replaced or expired. */
export function getPasswordReset(
  token: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<PasswordResetInfo> {
  return apiRequest(`/api/auth/password-reset/${encodeURIComponent(token)}`, {
    schema: passwordResetInfoSchema,
    signal,
  });
}

export function passwordResetQueryOptions(token: string) {
  return queryOptions({
    queryKey: queryKeys.passwordResets.detail(token),
    // A link's state changes only when it is used (then this page is left) or replaced.
    staleTime: Infinity,
    refetchOnWindowFocus: false,
    queryFn: ({ signal }) => getPasswordReset(token, { signal }),
  });
}

export function usePasswordReset(token: string) {
  return useQuery(passwordResetQueryOptions(token));
}
