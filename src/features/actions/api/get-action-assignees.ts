import { assigneeListResponseSchema } from "@shared/schemas/actions";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

export interface AssigneeOption {
  id: string;
  name: string;
}

/** Who may own the site's actions: its active facilities leads. */
export async function getActionAssignees(
  siteId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<AssigneeOption[]> {
  const { people } = await apiRequest(`/api/sites/${encodeURIComponent(siteId)}/action-assignees`, {
    schema: assigneeListResponseSchema,
    signal,
  });
  return people;
}

export function actionAssigneesQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: queryKeys.actions.assignees(siteId),
    queryFn: ({ signal }) => getActionAssignees(siteId, { signal }),
  });
}

export function useActionAssignees(siteId: string, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...actionAssigneesQueryOptions(siteId), enabled });
}
