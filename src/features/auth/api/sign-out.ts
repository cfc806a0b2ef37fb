import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { meQueryKey } from "./get-me";

export function signOut(): Promise<undefined> {
  return apiRequest("/api/auth/sign-out", { method: "POST" });
}

export function signOutMutationOptions(queryClient: QueryClient) {
  return mutationOptions({
    mutationKey: ["sessions", "sign-out"],
    mutationFn: signOut,
    onSuccess: () => {
      queryClient.setQueryData(meQueryKey, null);
      queryClient.removeQueries({ predicate: (query) => query.queryKey[0] !== meQueryKey[0] });
    },
  });
}

export function useSignOut() {
  const queryClient = useQueryClient();
  return useMutation(signOutMutationOptions(queryClient));
}
