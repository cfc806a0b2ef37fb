import { type ChecklistVersion, checklistVersionSchema } from "@shared/schemas/checklists";
import type { ZoneType } from "@shared/zones";
import {
  mutationOptions,
  type QueryClient,
  useMutation,
  useQueryClient,
} from "@tanstack/react-query";
import { z } from "zod";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

const publishedReplySchema = z.object({ published: checklistVersionSchema });

/** Publishes the saved draft as the next version; audits started from now on use it. */
export async function publishChecklist(zoneType: ZoneType): Promise<ChecklistVersion> {
  const { published } = await apiRequest(
    `/api/checklists/${encodeURIComponent(zoneType)}/publish`,
    { method: "POST", schema: publishedReplySchema },
  );
  return published;
}

export function publishChecklistMutationOptions(queryClient: QueryClient, zoneType: ZoneType) {
  return mutationOptions({
    mutationKey: ["checklists", "publish", zoneType],
    mutationFn: () => publishChecklist(zoneType),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: queryKeys.checklists.list }),
  });
}

export function usePublishChecklist(zoneType: ZoneType) {
  const queryClient = useQueryClient();
  return useMutation(publishChecklistMutationOptions(queryClient, zoneType));
}
