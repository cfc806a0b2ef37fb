import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { afterRetirement, sendRetirement } from "./retirement-request";

/** Retires a floor with its spaces. */
export function retireFloor(floorId: string, reason?: string) {
  return sendRetirement(`/api/floors/${encodeURIComponent(floorId)}/retire`, reason);
}

export function retireFloorMutationOptions(queryClient: QueryClient) {
  return mutationOptions({
    mutationKey: ["floors", "retire"],
    mutationFn: (input: { floorId: string; reason?: string }) =>
      retireFloor(input.floorId, input.reason),
    onSuccess: () => afterRetirement(queryClient),
  });
}

export function useRetireFloor() {
  const queryClient = useQueryClient();
  return useMutation(retireFloorMutationOptions(queryClient));
}
