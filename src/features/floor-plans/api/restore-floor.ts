import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { afterRetirement, sendRetirement } from "./retirement-request";

/** Restores a floor with the spaces retired with it. */
export function restoreFloor(floorId: string, reason?: string) {
  return sendRetirement(`/api/floors/${encodeURIComponent(floorId)}/restore`, reason);
}

export function restoreFloorMutationOptions(queryClient: QueryClient) {
  return mutationOptions({
    mutationKey: ["floors", "restore"],
    mutationFn: (input: { floorId: string; reason?: string }) =>
      restoreFloor(input.floorId, input.reason),
    onSuccess: () => afterRetirement(queryClient),
  });
}

export function useRestoreFloor() {
  const queryClient = useQueryClient();
  return useMutation(restoreFloorMutationOptions(queryClient));
}
