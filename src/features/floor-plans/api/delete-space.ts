import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { floorDetailChanged } from "./get-floor";

/** Deletes a space; the server deletes its fixtures with it. */
export async function deleteSpace(spaceId: string): Promise<void> {
  await apiRequest(`/api/spaces/${encodeURIComponent(spaceId)}`, { method: "DELETE" });
}

export function deleteSpaceMutationOptions(queryClient: QueryClient, floorId: string) {
  return mutationOptions({
    mutationKey: ["spaces", "delete", floorId],
    mutationFn: deleteSpace,
    onSuccess: (_nothing, spaceId) =>
      floorDetailChanged(queryClient, floorId, (detail) => ({
        ...detail,
        spaces: detail.spaces.filter((space) => space.id !== spaceId),
        fixtures: detail.fixtures.filter((fixture) => fixture.spaceId !== spaceId),
      })),
  });
}

export function useDeleteSpace(floorId: string) {
  const queryClient = useQueryClient();
  return useMutation(deleteSpaceMutationOptions(queryClient, floorId));
}
