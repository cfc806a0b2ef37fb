import { spaceParamsSchema } from "@shared/schemas/floors";
import { type QueryClient, useQueryClient } from "@tanstack/react-query";
import { useCallback, useState } from "react";
import { useNavigate, useParams } from "react-router-dom";

import { paths } from "@/config/paths";
import { cachedSpaceName } from "@/features/floor-plans/api/get-floor";
import { scheduledSpaceName } from "@/features/walkthroughs/api/get-site-schedule";
import { StartAudit } from "@/features/walkthroughs/components/start-audit";
import { canAnywhere } from "@/lib/authorization";

import { usePersonIfKnown } from "./audit-person";
import { NotAvailable } from "./not-available";

/** The space's name from whatever list the auditor came from: the due list or a floor. */
function knownSpaceName(queryClient: QueryClient, spaceId: string): string | null {
  return scheduledSpaceName(queryClient, spaceId) ?? cachedSpaceName(queryClient, spaceId);
}

function StartAuditPage({ spaceId }: { spaceId: string }) {
  const me = usePersonIfKnown();
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const [spaceName] = useState(() => knownSpaceName(queryClient, spaceId));
  const onReady = useCallback(
    (auditId: string) => void navigate(paths.audit.getHref(auditId), { replace: true }),
    [navigate],
  );

  if (me && !canAnywhere(me.roles, "conduct:audit:site")) {
    return (
      <NotAvailable description="Only auditors start audits. If you need to, ask an administrator of your site for the auditor role." />
    );
  }
  return (
    <>
      <title>Starting an audit · Lintel</title>
      {spaceName ? <h1 className="mb-4 text-2xl font-bold tracking-tight">{spaceName}</h1> : null}
      <StartAudit
        spaceId={spaceId}
        spaceName={spaceName}
        personId={me?.user.id ?? null}
        onReady={onReady}
      />
    </>
  );
}

/**
 * Where a space's QR code leads: opens this person's draft for the space on this phone, or
 * starts a new audit — also without a connection.
 */
export function StartAuditRoute() {
  const parsed = spaceParamsSchema.safeParse(useParams());
  if (!parsed.success)
    return <NotAvailable description="This QR code or link does not name a space Lintel knows." />;
  return <StartAuditPage key={parsed.data.spaceId} spaceId={parsed.data.spaceId} />;
}
