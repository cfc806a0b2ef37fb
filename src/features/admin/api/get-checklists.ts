import { type ChecklistsResponse, checklistsResponseSchema } from "@shared/schemas/checklists";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** Each zone type's published checklist and its draft, if one is being prepared. */
export function getChecklists({
  signal,
}: { signal?: AbortSignal } = {}): Promise<ChecklistsResponse> {
  return apiRequest("/api/checklists", { schema: checklistsResponseSchema, signal });
}

export function checklistsQueryOptions() {
  return queryOptions({
    queryKey: queryKeys.checklists.list,
    queryFn: ({ signal }) => getChecklists({ signal }),
  });
}

export function useChecklists() {
  return useQuery(checklistsQueryOptions());
}
