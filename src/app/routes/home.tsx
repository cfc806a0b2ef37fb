import type { QueryClient } from "@tanstack/react-query";
import { Link, useLocation } from "react-router-dom";

import { Alert } from "@/components/ui/alert";

import { buttonStyles } from "@/components/ui/button";
import { PageSkeleton } from "@/components/ui/skeleton";
import { paths } from "@/config/paths";
import { myActionsQueryOptions } from "@/features/actions/api/get-my-actions";
import { myChecksQueryOptions } from "@/features/actions/api/get-my-checks";
import { ActionsToCheck } from "@/features/actions/components/actions-to-check";
import { MyActions } from "@/features/actions/components/my-actions";
import { undeliveredMailQueryOptions } from "@/features/admin/api/get-undelivered-mail";
import { pressureNowQueryOptions } from "@/features/pressure-now/api/get-pressure-now";
import { PressureAlarmCards } from "@/features/pressure-now/components/pressure-alarm-cards";
import { UndeliveredMailNotice } from "@/features/admin/components/undelivered-mail-notice";
import { retiredSitesQueryOptions } from "@/features/sites/api/get-retired-sites";
import { sitesQueryOptions, useSites } from "@/features/sites/api/get-sites";
import { RetiredSites } from "@/features/sites/components/retired-sites";
import { SitesList } from "@/features/sites/components/sites-list";
import { myDueQueryOptions } from "@/features/walkthroughs/api/get-my-due";
import { MyDueAudits } from "@/features/walkthroughs/components/my-due-audits";
import { useAuthorization } from "@/lib/authorization";
import { useSettled } from "@/lib/use-settled";

import { isSignedIn } from "../session";
import { useSignedInPerson } from "./protected-layout";

export function homeLoader(queryClient: QueryClient) {
  return async () => {
    if (await isSignedIn(queryClient)) void queryClient.prefetchQuery(sitesQueryOptions());
    return null;
  };
}

function firstName(name: string): string {
  return name.trim().split(/\s+/)[0] ?? name;
}

export function HomeRoute() {
  const me = useSignedInPerson();
  const { can, canAnywhere } = useAuthorization();
  const notice = (useLocation().state as { notice?: string } | null)?.notice;
  const mayResend = can("resend:mail:network");
  const mayWork = canAnywhere("work:action:site");
  const mayVerify = canAnywhere("verify:action:site");
  const mayAudit = canAnywhere("conduct:audit:site");
  const mayCreate = can("create:site:network");
  const siteIds = (useSites().data ?? []).map((site) => site.id);
  // The lists below arrive one by one; shown together, none pushes another down the screen.
  const settled = useSettled([
    mayResend && undeliveredMailQueryOptions(),
    mayWork && myActionsQueryOptions(),
    mayVerify && myChecksQueryOptions(),
    mayAudit && myDueQueryOptions(),
    sitesQueryOptions(),
    mayCreate && retiredSitesQueryOptions(),
    ...siteIds.map((siteId) => pressureNowQueryOptions(siteId)),
  ]);
  return (
    <>
      <title>My sites · Lintel</title>
      <div className="mb-6 flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-2xl font-bold tracking-tight md:text-3xl">My sites</h1>
          <p className="mt-2 text-ink-muted">
            Hello {firstName(me.user.name)}. These are the sites where you hold a role.
          </p>
        </div>
        {mayCreate ? (
          <Link to={paths.newSite.getHref()} className={buttonStyles()}>
            Add a site
          </Link>
        ) : null}
      </div>
      {notice ? (
        <Alert role="status" tone="success" className="mb-6">
          {notice}
        </Alert>
      ) : null}
      {settled ? (
        <>
          <PressureAlarmCards
            siteIds={siteIds}
            canAcknowledge={(siteId) => can("acknowledge:pressure-alarm:site", siteId)}
            spaceHref={paths.spaceAudits.getHref}
          />
          {mayResend ? <UndeliveredMailNotice href={paths.undeliveredMail.getHref()} /> : null}
          {mayWork ? <MyActions actionHref={paths.action.getHref} /> : null}
          {mayVerify ? <ActionsToCheck actionHref={paths.action.getHref} /> : null}
          {mayAudit ? (
            <MyDueAudits startHref={(spaceId) => paths.startAudit.getHref(spaceId)} />
          ) : null}
          <SitesList />
          {mayCreate ? <RetiredSites /> : null}
        </>
      ) : (
        <PageSkeleton label="Loading your sites…" />
      )}
    </>
  );
}
