import { type Floor, floorSchema } from "@shared/schemas/floors";
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

/** Sends the plan image as multipart/form-data in the field the server reads, `plan`. */
export async function uploadFloorPlan(floorId: string, file: File): Promise<Floor> {
  const form = new FormData();
  form.append("plan", file);
  const { floor } = await apiRequest(`/api/floors/${encodeURIComponent(floorId)}/plan`, {
    method: "PUT",
    body: form,
    schema: floorReplySchema,
  });
  return floor;
}

export function uploadFloorPlanMutationOptions(queryClient: QueryClient, floorId: string) {
  return mutationOptions({
    mutationKey: ["floors", "plan", floorId],
    mutationFn: (file: File) => uploadFloorPlan(floorId, file),
    onSuccess: (floor) => floorChanged(queryClient, floor),
  });
}

export function useUploadFloorPlan(floorId: string) {
  const queryClient = useQueryClient();
  return useMutation(uploadFloorPlanMutationOptions(queryClient, floorId));
}
