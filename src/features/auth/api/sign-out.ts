import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

export function signOut(): Promise<undefined> {
  return apiRequest("/api/auth/sign-out", { method: "POST" });
}

export function signOutMutationOptions(queryClient: QueryClient) {
  return mutationOptions({
    mutationKey: ["sessions", "sign-out"],
    mutationFn: signOut,
    onSuccess: () => {
      queryClient.setQueryData(queryKeys.sessions.me, null);
      queryClient.removeQueries({
        predicate: (query) => query.queryKey[0] !== queryKeys.sessions.me[0],
      });
    },
  });
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation(signOutMutationOptions(queryClient));
}
