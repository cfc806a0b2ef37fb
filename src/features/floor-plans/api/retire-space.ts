import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { afterRetirement, sendRetirement } from "./retirement-request";

/** Retires a space. */
export function retireSpace(spaceId: string, reason?: string) {
  return sendRetirement(`/api/spaces/${encodeURIComponent(spaceId)}/retire`, reason);
}

export function retireSpaceMutationOptions(queryClient: QueryClient) {
  return mutationOptions({
    mutationKey: ["spaces", "retire"],
    mutationFn: (input: { spaceId: string; reason?: string }) =>
      retireSpace(input.spaceId, input.reason),
    onSuccess: () => afterRetirement(queryClient),
  });
}

export function useRetireSpace() {
  const queryClient = useQueryClient();
  return useMutation(retireSpaceMutationOptions(queryClient));
}
