import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { afterRetirement, sendRetirement } from "./retirement-request";

/** Restores a space. */
export function restoreSpace(spaceId: string, reason?: string) {
  return sendRetirement(`/api/spaces/${encodeURIComponent(spaceId)}/restore`, reason);
}

export function restoreSpaceMutationOptions(queryClient: QueryClient) {
  return mutationOptions({
    mutationKey: ["spaces", "restore"],
    mutationFn: (input: { spaceId: string; reason?: string }) =>
      restoreSpace(input.spaceId, input.reason),
    onSuccess: () => afterRetirement(queryClient),
  });
}

export function useRestoreSpace() {
  const queryClient = useQueryClient();
  return useMutation(restoreSpaceMutationOptions(queryClient));
}
