import type { AuditDetail } from "@shared/schemas/audits";
import { useEffect, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Spinner } from "@/components/ui/spinner";
import { newDeviceId } from "@/lib/device-ids";

import { auditDevice, hasOfflineStorage } from "../lib/audit-device";

export interface StartAuditProps {
  spaceId: string;
  /** Shown as the heading at once, when the space was picked from a list. */
  spaceName: string | null;
  personId: string | null;
  /**
   * The audit built from what the phone keeps (checklist version, room facts), so it can begin
   * with no signal; null to wait for Lintel's copy.
   */
  prepare?: (auditId: string, now: Date) => Promise<AuditDetail | null>;
  /** Called with the audit to open: the person's open draft for the space, or a new one. */
  onReady: (auditId: string) => void;
}

/**
 * Opens the audit for a space: resumes this person's draft on this phone, or starts a new one
 * with an id made here. Nothing waits for the network; the sync queue tells the server.
 */
export function StartAudit({ spaceId, spaceName, personId, prepare, onReady }: StartAuditProps) {
  const [problem, setProblem] = useState<string | null>(() =>
    hasOfflineStorage()
      ? null
      : "This browser cannot keep audits on the phone, so an audit cannot start here. Try another browser, or leave private browsing.",
  );

  useEffect(() => {
    if (!hasOfflineStorage()) return;
    let live = true;
    const auditId = newDeviceId();
    const now = new Date();
    auditDevice()
      .then(async ({ store, personId: owner }) => {
        // Resuming an open draft needs nothing built.
        const open = (await store.auditsForSpace(spaceId)).find((a) => a.state === "draft");
        const detail = open || !prepare ? null : await prepare(auditId, now).catch(() => null);
        return store.openDraft({
          spaceId,
          spaceName: detail?.audit.spaceName ?? spaceName,
          auditorId: personId ?? owner,
          auditId,
          now,
          detail,
        });
      })
      .then(
        (audit) => {
          if (live) onReady(audit.auditId);
        },
        () => {
          if (live) setProblem("The audit could not be kept on this phone. Try again.");
        },
      );
    return () => {
      live = false;
    };
  }, [spaceId, spaceName, personId, prepare, onReady]);

  if (problem) {
    return (
      <Alert role="alert" tone="error" title="The audit did not start">
        <p>{problem}</p>
      </Alert>
    );
  }
  return <Spinner label="Starting the audit…" className="py-8" />;
}
