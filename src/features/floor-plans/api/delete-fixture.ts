import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

import { floorDetailChanged } from "./get-floor";

export async function deleteFixture(fixtureId: string): Promise<void> {
  await apiRequest(`/api/fixtures/${encodeURIComponent(fixtureId)}`, { method: "DELETE" });
}

export function deleteFixtureMutationOptions(queryClient: QueryClient, floorId: string) {
  return mutationOptions({
    mutationKey: ["fixtures", "delete", floorId],
    mutationFn: deleteFixture,
    onSuccess: (_nothing, fixtureId) =>
      floorDetailChanged(queryClient, floorId, (detail) => ({
        ...detail,
        fixtures: detail.fixtures.filter((fixture) => fixture.id !== fixtureId),
      })),
  });
}

export function useDeleteFixture(floorId: string) {
  const queryClient = useQueryClient();
  return useMutation(deleteFixtureMutationOptions(queryClient, floorId));
}
