import { siteParamsSchema } from "@shared/schemas/site";
import type { QueryClient } from "@tanstack/react-query";
import { Link, type LoaderFunctionArgs, useParams } from "react-router-dom";

import { buttonStyles } from "@/components/ui/button";
import { CautionNote } from "@/components/ui/caution-note";
import { TextLink } from "@/components/ui/text-link";
import { paths } from "@/config/paths";
import { usePressureNow } from "@/features/pressure-now/api/get-pressure-now";
import { liveStateOf } from "@/features/pressure-now/components/room-live-state";
import { siteQueryOptions, useSite } from "@/features/sites/api/get-site";
import { siteScheduleQueryOptions } from "@/features/walkthroughs/api/get-site-schedule";
import { SchedulePanel } from "@/features/walkthroughs/components/due-list";
import { useAuthorization } from "@/lib/authorization";

import { isSignedIn } from "../session";
import { NotAvailable } from "./not-available";

export function siteDueLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const parsed = siteParamsSchema.safeParse(params);
    if (parsed.success && (await isSignedIn(queryClient))) {
      void queryClient.prefetchQuery(siteQueryOptions(parsed.data.siteId));
      void queryClient.prefetchQuery(siteScheduleQueryOptions(parsed.data.siteId));
    }
    return null;
  };
}

function SiteDuePage({ siteId }: { siteId: string }) {
  const { can } = useAuthorization();
  const site = useSite(siteId);
  const pressure = usePressureNow(siteId);
  const siteName = site.data?.name;

  return (
    <>
      <title>{`Due for audit · ${siteName ?? "Site"} · Lintel`}</title>
      <p className="text-sm">
        <TextLink to={paths.site.getHref(siteId)}>{siteName ?? "Back to the site"}</TextLink>
      </p>
      <div className="mt-2 mb-6 flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-2xl font-bold tracking-tight md:text-3xl">Due for audit</h1>
          <p className="mt-1 text-ink-muted">
            Every space{siteName ? ` at ${siteName}` : ""}, most overdue first.
          </p>
        </div>
        {can("update:site:site", siteId) ? (
          <Link
            to={paths.qrSheet.getHref(siteId)}
            className={buttonStyles({ variant: "secondary" })}
          >
            Print QR codes
          </Link>
        ) : null}
      </div>
      <div className="flex flex-col gap-6">
        <SchedulePanel
          siteId={siteId}
          canStart={can("conduct:audit:site", siteId)}
          canChangeCadence={can("update:site:site", siteId)}
          startHref={paths.startAudit.getHref}
          historyHref={paths.spaceAudits.getHref}
          observeHref={paths.startObservation.getHref}
          liveState={liveStateOf(pressure.data)}
        />
        <CautionNote />
      </div>
    </>
  );
}

export function SiteDueRoute() {
  const parsed = siteParamsSchema.safeParse(useParams());
  if (!parsed.success) return <NotAvailable description="There is no site at this address." />;
  return <SiteDuePage key={parsed.data.siteId} siteId={parsed.data.siteId} />;
}
