import { type AuditDetail, auditDetailSchema } from "@shared/schemas/audits";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

export function auditQueryKey(auditId: string) {
  return ["audits", "detail", auditId] as const;
}

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
    queryKey: auditQueryKey(auditId),
    queryFn: ({ signal }) => getAudit(auditId, { signal }),
  });
}

export function useAudit(auditId: string, { enabled = true }: { enabled?: boolean } = {}) {
  return useQuery({ ...auditQueryOptions(auditId), enabled });
}
