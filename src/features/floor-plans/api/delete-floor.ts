import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { afterRetirement } from "./retirement-request";

/** Deletes a floor none of whose spaces has history; the server answers 409 otherwise. */
export async function deleteFloor(floorId: string): Promise<void> {
  await apiRequest(`/api/floors/${encodeURIComponent(floorId)}`, { method: "DELETE" });
}

export function deleteFloorMutationOptions(queryClient: QueryClient) {
  return mutationOptions({
    mutationKey: ["floors", "delete"],
    mutationFn: deleteFloor,
    onSuccess: () => afterRetirement(queryClient),
  });
}

export function useDeleteFloor() {
  const queryClient = useQueryClient();
  return useMutation(deleteFloorMutationOptions(queryClient));
}
