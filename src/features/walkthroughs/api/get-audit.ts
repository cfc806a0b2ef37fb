import { type AuditDetail, auditDetailSchema } from "@shared/schemas/audits";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** One audit with its pinned items, answers and photos: for audits not kept on this phone. */
export function getAudit(
  auditId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<AuditDetail> {
  return apiRequest(`/api/audits/${encodeURIComponent(auditId)}`, {
    schema: auditDetailSchema,
    signal,
  });
}

export function auditQueryOptions(auditId: string) {
  return queryOptions({
    queryKey: queryKeys.audits.detail(auditId),
    queryFn: ({ signal }) => getAudit(auditId, { signal }),
  });
}

export function useAudit(auditId: string, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...auditQueryOptions(auditId), enabled });
}
