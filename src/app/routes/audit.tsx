import { auditParamsSchema } from "@shared/schemas/audits";
import { Link, useParams } from "react-router-dom";

import { buttonStyles } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { TextLink } from "@/components/ui/text-link";
import { paths } from "@/config/paths";
import {
  Pressure24hAside,
  showsPressureHistory,
} from "@/features/pressure-now/components/pressure-24h-aside";
import { AmendAuditForm } from "@/features/walkthroughs/components/amend-audit-form";
import { AuditScreen } from "@/features/walkthroughs/components/audit-screen";
import { useAuthorization } from "@/lib/authorization";

import { usePersonIfKnown } from "./audit-person";

function AuditNotFound() {
  return (
    <>
      <title>Audit not found · Lintel</title>
      <EmptyState
        headingLevel={1}
        title="This audit is not available"
        description="It is not kept on this phone, and Lintel does not know it, it belongs to a site where you hold no role, or it is another auditor's draft (shown once submitted)."
        action={<TextLink to={paths.home.getHref()}>Back to my sites</TextLink>}
      />
    </>
  );
}

/** One audit: answered item by item on the phone, or read back once submitted. */
export function AuditRoute() {
  const parsed = auditParamsSchema.safeParse(useParams());
  const me = usePersonIfKnown();
  const { can } = useAuthorization();
  if (!parsed.success) return <AuditNotFound />;
  const { auditId } = parsed.data;
  return (
    <AuditScreen
      key={auditId}
      auditId={auditId}
      personId={me?.user.id ?? null}
      notFound={<AuditNotFound />}
      itemAside={(item, detail) =>
        showsPressureHistory(item.key, detail.audit.zoneType) ? (
          <Pressure24hAside spaceId={detail.audit.spaceId} />
        ) : null
      }
      afterLinks={(detail) => (
        <>
          <Link to={paths.siteDue.getHref(detail.audit.siteId)} className={buttonStyles()}>
            What is due next
          </Link>
          <Link
            to={paths.spaceAudits.getHref(detail.audit.spaceId)}
            className={buttonStyles({ variant: "secondary" })}
          >
            Audit history
          </Link>
          {detail.audit.status === "submitted" && can("update:site:site", detail.audit.siteId) ? (
            <AmendAuditForm detail={detail} />
          ) : null}
        </>
      )}
    />
  );
}
