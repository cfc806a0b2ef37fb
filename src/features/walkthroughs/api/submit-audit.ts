import { type AuditDetail, auditDetailSchema } from "@shared/schemas/audits";

import { apiRequest } from "@/lib/api-client";

/**
 * Submits the audit; the reply carries the verdict and score. Submitting again returns the same.
 * A 400 names the items still in the way (`items.<itemId>`). Sent by the sync queue.
 */
export function submitAudit(auditId: string): Promise<AuditDetail> {
  return apiRequest(`/api/audits/${encodeURIComponent(auditId)}/submit`, {
    method: "POST",
    schema: auditDetailSchema,
  });
}
