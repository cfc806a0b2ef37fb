import { spaceParamsSchema } from "@shared/schemas/floors";
import { type QueryClient, useQueryClient } from "@tanstack/react-query";
import { Link, type LoaderFunctionArgs, useParams } from "react-router-dom";

import { buttonStyles } from "@/components/ui/button";
import { TextLink } from "@/components/ui/text-link";
import { paths } from "@/config/paths";
import { PageSkeleton } from "@/components/ui/skeleton";
import {
  roomPressureQueryOptions,
  useRoomPressure,
} from "@/features/pressure/api/get-room-pressure";
import { RoomPressureSection } from "@/features/pressure/components/room-pressure-section";
import { spaceAuditsQueryOptions } from "@/features/walkthroughs/api/get-space-audits";
import { AuditHistory } from "@/features/walkthroughs/components/audit-history";
import { isObservedZone } from "@/features/walkthroughs/lib/observation-flow";
import { useAuthorization } from "@/lib/authorization";

import { isSignedIn } from "../session";
import { knownSpace } from "./known-space";
import { NotAvailable } from "./not-available";

export function spaceAuditsLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const parsed = spaceParamsSchema.safeParse(params);
    if (parsed.success && (await isSignedIn(queryClient))) {
      void queryClient.prefetchQuery(spaceAuditsQueryOptions(parsed.data.spaceId));
      void queryClient.prefetchQuery(roomPressureQueryOptions(parsed.data.spaceId, "24h"));
    }
    return null;
  };
}

/**
 * A space's page: for an isolation room its live pressure, then its audits (date, auditor,
 * verdict, score; each opens read-only once submitted).
 */
export function SpaceAuditsRoute() {
  const { can, canAnywhere } = useAuthorization();
  const queryClient = useQueryClient();
  const parsed = spaceParamsSchema.safeParse(useParams());
  const spaceId = parsed.success ? parsed.data.spaceId : "";
  const pressure = useRoomPressure(spaceId, "24h", parsed.success);
  if (!parsed.success) return <NotAvailable description="There is no space at this address." />;
  // The page is drawn once, with the room's pressure above the audits, so nothing moves when the
  // pressure arrives; only the first attempt is waited for (offline, the audits on this phone
  // show at once).
  if (pressure.isPending && pressure.fetchStatus === "fetching" && pressure.failureCount === 0)
    return <PageSkeleton label="Loading audits…" blocks={[3.5, 16]} />;
  return (
    <AuditHistory
      key={spaceId}
      spaceId={spaceId}
      auditHref={paths.audit.getHref}
      beforeAudits={
        <RoomPressureSection
          spaceId={spaceId}
          canManage={(siteId) => can("update:site:site", siteId)}
        />
      }
      backLink={(siteId) =>
        siteId ? (
          <TextLink to={paths.siteDue.getHref(siteId)}>Due for audit</TextLink>
        ) : (
          <TextLink to={paths.home.getHref()}>My sites</TextLink>
        )
      }
      startAction={(siteId) =>
        (siteId ? can("conduct:audit:site", siteId) : canAnywhere("conduct:audit:site")) ? (
          <div className="flex flex-wrap gap-2">
            <Link to={paths.startAudit.getHref(spaceId)} className={buttonStyles()}>
              Start audit
            </Link>
            {isObservedZone(knownSpace(queryClient, spaceId)?.zoneType) ? (
              <Link
                to={paths.startObservation.getHref(spaceId)}
                className={buttonStyles({ variant: "secondary" })}
              >
                Observe putting on or removal
              </Link>
            ) : null}
          </div>
        ) : null
      }
    />
  );
}
