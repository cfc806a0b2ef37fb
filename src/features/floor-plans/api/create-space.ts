import { type Space, type SpaceBody, spaceSchema } from "@shared/schemas/floors";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";
import { z } from "zod";

import { apiRequest } from "@/lib/api-client";

import { floorDetailChanged } from "./get-floor";

const spaceReplySchema = z.object({ space: spaceSchema });

export async function createSpace(floorId: string, body: SpaceBody): Promise<Space> {
  const { space } = await apiRequest(`/api/floors/${encodeURIComponent(floorId)}/spaces`, {
    method: "POST",
    body,
    schema: spaceReplySchema,
  });
  return space;
}

export function createSpaceMutationOptions(queryClient: QueryClient, floorId: string) {
  return mutationOptions({
    mutationKey: ["spaces", "create", floorId],
    mutationFn: (body: SpaceBody) => createSpace(floorId, body),
    onSuccess: (space) =>
      floorDetailChanged(queryClient, floorId, (detail) => ({
        ...detail,
        spaces: [...detail.spaces, space],
      })),
  });
}

export function useCreateSpace(floorId: string) {
  const queryClient = useQueryClient();
  return useMutation(createSpaceMutationOptions(queryClient, floorId));
}
