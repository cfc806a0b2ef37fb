import { type AuditDetail, auditDetailSchema, type StartAuditBody } from "@shared/schemas/audits";

import { apiRequest } from "@/lib/api-client";

/**
 * Starts the audit under the id this phone made, or returns it if it already exists: a start
 * repeated after a lost reply is harmless. The audit pins the checklist version the phone began
 * with (`checklistVersionId`), or else the one published now.
 * Sent by the sync queue, never directly from a screen.
 */
export function startAudit(auditId: string, body: StartAuditBody): Promise<AuditDetail> {
  return apiRequest(`/api/audits/${encodeURIComponent(auditId)}`, {
    method: "PUT",
    body,
    schema: auditDetailSchema,
  });
}
