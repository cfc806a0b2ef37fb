import { type Floor, floorSchema, type ScaleBody } from "@shared/schemas/floors";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";
import { z } from "zod";

import { apiRequest } from "@/lib/api-client";

import { floorChanged } from "./get-floor";

const floorReplySchema = z.object({ floor: floorSchema });

export async function setFloorScale(floorId: string, body: ScaleBody): Promise<Floor> {
  const { floor } = await apiRequest(`/api/floors/${encodeURIComponent(floorId)}/scale`, {
    method: "PUT",
    body,
    schema: floorReplySchema,
  });
  return floor;
}

export function setFloorScaleMutationOptions(queryClient: QueryClient, floorId: string) {
  return mutationOptions({
    mutationKey: ["floors", "scale", floorId],
    mutationFn: (body: ScaleBody) => setFloorScale(floorId, body),
    onSuccess: (floor) => floorChanged(queryClient, floor),
  });
}

export function useSetFloorScale(floorId: string) {
  const queryClient = useQueryClient();
  return useMutation(setFloorScaleMutationOptions(queryClient, floorId));
}
