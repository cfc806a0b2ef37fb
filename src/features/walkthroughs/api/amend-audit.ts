import { type AmendmentBody, type AuditDetail, auditDetailSchema } from "@shared/schemas/audits";
import { useMutation, useQueryClient } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { invalidateAfterAuditChange } from "@/lib/audit-change";
import { queryKeys } from "@/lib/query-keys";

/** An administrator's logged correction of a submitted audit; the reply has the new verdict. */
export function amendAudit(auditId: string, body: AmendmentBody): Promise<AuditDetail> {
  return apiRequest(`/api/audits/${encodeURIComponent(auditId)}/amendments`, {
    method: "POST",
    body,
    schema: auditDetailSchema,
  });
}

export function useAmendAudit(auditId: string) {
  const queryClient = useQueryClient();
  return useMutation({
    mutationFn: (body: AmendmentBody) => amendAudit(auditId, body),
    onSuccess: async (detail) => {
      queryClient.setQueryData(queryKeys.audits.detail(auditId), detail);
      await invalidateAfterAuditChange(queryClient, detail.audit);
    },
  });
}
