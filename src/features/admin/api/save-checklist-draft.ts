import {
  type ChecklistDraftBody,
  type ChecklistVersion,
  checklistVersionSchema,
} from "@shared/schemas/checklists";
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

const draftReplySchema = z.object({ draft: checklistVersionSchema });

/** Creates or replaces the zone type's draft: the array's order is the order; left out is retired. */
export async function saveChecklistDraft(
  zoneType: ZoneType,
  body: ChecklistDraftBody,
): Promise<ChecklistVersion> {
  const { draft } = await apiRequest(`/api/checklists/${encodeURIComponent(zoneType)}/draft`, {
    method: "PUT",
    body,
    schema: draftReplySchema,
  });
  return draft;
}

export function saveChecklistDraftMutationOptions(queryClient: QueryClient, zoneType: ZoneType) {
  return mutationOptions({
    mutationKey: ["checklists", "draft", zoneType],
    mutationFn: (body: ChecklistDraftBody) => saveChecklistDraft(zoneType, body),
    onSuccess: () => queryClient.invalidateQueries({ queryKey: queryKeys.checklists.list }),
  });
}

export function useSaveChecklistDraft(zoneType: ZoneType) {
  const queryClient = useQueryClient();
  return useMutation(saveChecklistDraftMutationOptions(queryClient, zoneType));
}
