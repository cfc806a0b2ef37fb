import { type Suite, suiteSchema } from "@shared/schemas/floors";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";
import { z } from "zod";

import { apiRequest } from "@/lib/api-client";

import { floorDetailChanged } from "./get-floor";

const suiteReplySchema = z.object({ suite: suiteSchema });

export async function createSuite(floorId: string, body: { name: string }): Promise<Suite> {
  const { suite } = await apiRequest(`/api/floors/${encodeURIComponent(floorId)}/suites`, {
    method: "POST",
    body,
    schema: suiteReplySchema,
  });
  return suite;
}

export function createSuiteMutationOptions(queryClient: QueryClient, floorId: string) {
  return mutationOptions({
    mutationKey: ["suites", "create", floorId],
    mutationFn: (body: { name: string }) => createSuite(floorId, body),
    onSuccess: (suite) =>
      floorDetailChanged(queryClient, floorId, (detail) => ({
        ...detail,
        suites: [...detail.suites, suite],
      })),
  });
}

export function useCreateSuite(floorId: string) {
  const queryClient = useQueryClient();
  return useMutation(createSuiteMutationOptions(queryClient, floorId));
}
