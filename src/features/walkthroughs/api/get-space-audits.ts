import { type Audit, auditListResponseSchema } from "@shared/schemas/audits";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** The space's audits, newest first. */
export async function getSpaceAudits(
  spaceId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<Audit[]> {
  const { audits } = await apiRequest(`/api/spaces/${encodeURIComponent(spaceId)}/audits`, {
    schema: auditListResponseSchema,
    signal,
  });
  return audits;
}

export function spaceAuditsQueryOptions(spaceId: string) {
  return queryOptions({
    queryKey: queryKeys.audits.space(spaceId),
    queryFn: ({ signal }) => getSpaceAudits(spaceId, { signal }),
  });
}

export function useSpaceAudits(spaceId: string) {
  return useQuery(spaceAuditsQueryOptions(spaceId));
}
