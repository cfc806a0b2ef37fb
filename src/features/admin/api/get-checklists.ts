import { type ChecklistsResponse, checklistsResponseSchema } from "@shared/schemas/checklists";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

export const checklistsQueryKey = ["checklists", "list"] as const;

/** Each zone type's published checklist and its draft, if one is being prepared. */
export function getChecklists({
  signal,
}: { signal?: AbortSignal } = {}): Promise<ChecklistsResponse> {
  return apiRequest("/api/checklists", { schema: checklistsResponseSchema, signal });
}

export function checklistsQueryOptions() {
  return queryOptions({
    queryKey: checklistsQueryKey,
    queryFn: ({ signal }) => getChecklists({ signal }),
  });
}

export function useChecklists() {
  return useQuery(checklistsQueryOptions());
}
