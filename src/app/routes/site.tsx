import { roleLabels } from "@shared/roles";
import { siteParamsSchema } from "@shared/schemas/site";
import type { QueryClient } from "@tanstack/react-query";
import { Link, type LoaderFunctionArgs, useLocation, useParams } from "react-router-dom";

import { Alert } from "@/components/ui/alert";
import { Button, buttonStyles } from "@/components/ui/button";
import { CautionNote } from "@/components/ui/caution-note";
import { EmptyState } from "@/components/ui/empty-state";
import { PageSkeleton } from "@/components/ui/skeleton";
import { TextLink } from "@/components/ui/text-link";
import { paths } from "@/config/paths";
import { siteActionsQueryOptions } from "@/features/actions/api/get-site-actions";
import { SiteActionsSummary } from "@/features/actions/components/site-actions-summary";
import { floorsQueryOptions } from "@/features/floor-plans/api/get-floors";
import { retiredPlacesQueryOptions } from "@/features/floor-plans/api/get-retired-places";
import { FloorsSection } from "@/features/floor-plans/components/floors-section";
import { RetiredPlacesSection } from "@/features/floor-plans/components/retired-places-section";
import {
  pressureNowQueryOptions,
  usePressureNow,
} from "@/features/pressure-now/api/get-pressure-now";
import { liveStateOf } from "@/features/pressure-now/components/room-live-state";
import { siteQueryOptions, useSite } from "@/features/sites/api/get-site";
import { SiteDetails } from "@/features/sites/components/site-details";
import { siteScheduleQueryOptions } from "@/features/walkthroughs/api/get-site-schedule";
import { DueSection } from "@/features/walkthroughs/components/due-list";
import { isApiError } from "@/lib/api-client";
import { useAuthorization } from "@/lib/authorization";
import { useSettled } from "@/lib/use-settled";

import { isSignedIn } from "../session";
import { useSignedInPerson } from "./protected-layout";

export function siteLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const parsed = siteParamsSchema.safeParse(params);
    if (parsed.success && (await isSignedIn(queryClient))) {
      void queryClient.prefetchQuery(siteQueryOptions(parsed.data.siteId));
      void queryClient.prefetchQuery(floorsQueryOptions(parsed.data.siteId));
      void queryClient.prefetchQuery(siteScheduleQueryOptions(parsed.data.siteId));
      void queryClient.prefetchQuery(pressureNowQueryOptions(parsed.data.siteId));
      void queryClient.prefetchQuery(
        siteActionsQueryOptions(parsed.data.siteId, { state: "unfinished" }),
      );
    }
    return null;
  };
}

function SiteNotFound() {
  return (
    <>
      <title>Site not found · Lintel</title>
      <EmptyState
        headingLevel={1}
        title="This site is not available"
        description="It may not exist, or you do not hold a role there."
        action={<TextLink to={paths.home.getHref()}>Back to my sites</TextLink>}
      />
    </>
  );
}

function SiteOverview({ siteId }: { siteId: string }) {
  const me = useSignedInPerson();
  const { can } = useAuthorization();
  const site = useSite(siteId);
  const pressure = usePressureNow(siteId);
  const canEdit = can("update:site:site", siteId);
  const notice = (useLocation().state as { notice?: string } | null)?.notice;
  // Each section loads on its own; shown together, none pushes the next down the screen.
  const settled = useSettled([
    siteQueryOptions(siteId),
    siteScheduleQueryOptions(siteId),
    pressureNowQueryOptions(siteId),
    floorsQueryOptions(siteId),
    siteActionsQueryOptions(siteId, { state: "unfinished" }),
    canEdit && retiredPlacesQueryOptions(siteId),
  ]);

  if (site.isPending || (site.isSuccess && !settled))
    return <PageSkeleton label="Loading site…" blocks={[2.5, 12, 9, 14]} />;
  if (site.isError) {
    if (isApiError(site.error) && site.error.status === 404) return <SiteNotFound />;
    return (
      <>
        <h1 className="mb-4 text-2xl font-bold tracking-tight">Site</h1>
        <Alert role="alert" tone="error" title="We could not load this site">
          <p>{site.error.message}</p>
          <Button variant="secondary" className="mt-3" onClick={() => void site.refetch()}>
            Try again
          </Button>
        </Alert>
      </>
    );
  }

  const rolesHere = me.roles
    .filter((grant) => grant.siteId === null || grant.siteId === siteId)
    .map((grant) => roleLabels[grant.role]);

  return (
    <>
      <title>{`${site.data.name} · Lintel`}</title>
      <p className="text-sm">
        <TextLink to={paths.home.getHref()}>My sites</TextLink>
      </p>
      <div className="mt-2 flex flex-wrap items-start justify-between gap-4">
        <div>
          <h1 className="text-2xl font-bold tracking-tight md:text-3xl">{site.data.name}</h1>
          {rolesHere.length > 0 ? (
            <p className="mt-1 text-ink-muted">
              Your role here: {[...new Set(rolesHere)].join(", ")}
            </p>
          ) : null}
        </div>
        {canEdit ? (
          <Link
            to={paths.editSite.getHref(siteId)}
            className={buttonStyles({ variant: "secondary" })}
          >
            Edit site
          </Link>
        ) : null}
      </div>

      <div className="mt-6 flex flex-col gap-6">
        {notice ? (
          <Alert role="state" tone="success">
            {notice}
          </Alert>
        ) : null}
        <DueSection
          siteId={siteId}
          canStart={can("conduct:audit:site", siteId)}
          allHref={paths.siteDue.getHref(siteId)}
          startHref={paths.startAudit.getHref}
          historyHref={paths.spaceAudits.getHref}
          observeHref={paths.startObservation.getHref}
          liveState={liveStateOf(pressure.data)}
          actions={
            canEdit ? (
              <TextLink
                to={paths.qrSheet.getHref(siteId)}
                className="inline-flex min-h-tap items-center"
              >
                Print QR codes
              </TextLink>
            ) : null
          }
        />

        <SiteDetails site={site.data} />

        <FloorsSection
          siteId={siteId}
          canEdit={canEdit}
          floorHref={(floorId) => paths.floor.getHref(siteId, floorId)}
        />

        <SiteActionsSummary siteId={siteId} listHref={paths.siteActions.getHref(siteId)} />

        {canEdit ? (
          <RetiredPlacesSection siteId={siteId} historyHref={paths.spaceAudits.getHref} />
        ) : null}

        <CautionNote />
      </div>
    </>
  );
}

export function SiteRoute() {
  const parsed = siteParamsSchema.safeParse(useParams());
  if (!parsed.success) return <SiteNotFound />;
  return <SiteOverview key={parsed.data.siteId} siteId={parsed.data.siteId} />;
}
