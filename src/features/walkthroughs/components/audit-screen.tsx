import type { AuditDetail } from "@shared/schemas/audits";
import { type ReactNode, useEffect, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { EmptyState } from "@/components/ui/empty-state";
import { Spinner } from "@/components/ui/spinner";
import { isApiError } from "@/lib/api-client";

import { useAudit } from "../api/get-audit";
import { useLocalAudit } from "../hooks/use-local-audit";
import { auditDevice, hasOfflineStorage } from "../lib/audit-device";
import { AuditWalkthrough, type ItemAside, SubmittedAudit } from "./audit-walkthrough";

/** Brings a draft this person began elsewhere onto the phone, then the walkthrough takes over. */
function AdoptDraft({ detail }: { detail: AuditDetail }) {
  const [problem, setProblem] = useState<string | null>(null);
  useEffect(() => {
    void auditDevice()
      .then(({ store }) => store.adoptAudit(detail, new Date()))
      .catch(() => setProblem("This audit could not be kept on this phone."));
  }, [detail]);
  if (problem) {
    return (
      <Alert role="alert" tone="error" title="Not available offline">
        <p>{problem}</p>
      </Alert>
    );
  }
  return <Spinner label="Opening the audit…" className="py-6" />;
}

export interface AuditScreenProps {
  auditId: string;
  /** The signed-in person, when known (not known offline). */
  personId: string | null;
  afterLinks?: (detail: AuditDetail) => ReactNode;
  /** What the page shows beside an item while the audit is answered. */
  itemAside?: ItemAside;
  notFound: ReactNode;
}

/**
 * An audit by id: from the phone when it is kept here (no network needed), otherwise from the
 * server — read-only when submitted or someone else's, taken onto the phone when it is this
 * person's draft.
 */
export function AuditScreen({
  auditId,
  personId,
  afterLinks,
  itemAside,
  notFound,
}: AuditScreenProps) {
  const local = useLocalAudit(auditId);
  const server = useAudit(auditId, { enabled: local.status === "absent" });

  if (local.status === "loading") return <Spinner label="Opening the audit…" className="py-8" />;
  if (local.status === "ready") {
    return (
      <AuditWalkthrough snapshot={local.snapshot} afterLinks={afterLinks} itemAside={itemAside} />
    );
  }
  if (server.isPending) return <Spinner label="Opening the audit…" className="py-8" />;
  if (server.isError) {
    if (isApiError(server.error) && (server.error.status === 404 || server.error.status === 400)) {
      return notFound;
    }
    return (
      <EmptyState
        headingLevel={1}
        title="This audit is not on this phone"
        description={
          isApiError(server.error) && server.error.status === 0
            ? "Lintel cannot be reached from here. Open it again once there is a connection."
            : server.error.message
        }
      />
    );
  }
  const detail = server.data;
  const mine = personId !== null && detail.audit.auditorId === personId;
  if (detail.audit.status === "draft" && mine && hasOfflineStorage()) {
    return <AdoptDraft detail={detail} />;
  }
  return <SubmittedAudit detail={detail} afterLinks={afterLinks?.(detail)} />;
}
