import { type Floor, type floorBodySchema, floorSchema } from "@shared/schemas/floors";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";
import { z } from "zod";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

export type CreateFloorBody = z.output<typeof floorBodySchema>;

const floorReplySchema = z.object({ floor: floorSchema });

export async function createFloor(siteId: string, body: CreateFloorBody): Promise<Floor> {
  const { floor } = await apiRequest(`/api/sites/${encodeURIComponent(siteId)}/floors`, {
    method: "POST",
    body,
    schema: floorReplySchema,
  });
  return floor;
}

export function createFloorMutationOptions(queryClient: QueryClient, siteId: string) {
  return mutationOptions({
    mutationKey: ["floors", "create", siteId],
    mutationFn: (body: CreateFloorBody) => createFloor(siteId, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: queryKeys.floors.list(siteId) }),
  });
}

export function useCreateFloor(siteId: string) {
  const queryClient = useQueryClient();
  return useMutation(createFloorMutationOptions(queryClient, siteId));
}
