import { type MeResponse, meResponseSchema } from "@shared/schemas/auth";
import type { UpdateProfileBody } from "@shared/schemas/people";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

export function updateProfile(body: UpdateProfileBody): Promise<MeResponse> {
  return apiRequest("/api/auth/me", { method: "PATCH", body, schema: meResponseSchema });
}

export function updateProfileMutationOptions(queryClient: QueryClient) {
  return mutationOptions({
    mutationKey: ["sessions", "me", "update"],
    mutationFn: updateProfile,
    onSuccess: (me) => queryClient.setQueryData(queryKeys.sessions.me, me),
  });
}

export function useUpdateProfile() {
  const queryClient = useQueryClient();
  return useMutation(updateProfileMutationOptions(queryClient));
}
