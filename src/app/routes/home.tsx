import type { QueryClient } from "@tanstack/react-query";
import { Link, useLocation } from "react-router-dom";

import { Alert } from "@/components/ui/alert";

import { buttonStyles } from "@/components/ui/button";
import { paths } from "@/config/paths";

import { ActionsToCheck } from "@/features/actions/components/actions-to-check";
import { MyActions } from "@/features/actions/components/my-actions";
import { UndeliveredMailNotice } from "@/features/admin/components/undelivered-mail-notice";
import { sitesQueryOptions } from "@/features/sites/api/get-sites";
import { RetiredSites } from "@/features/sites/components/retired-sites";
import { SitesList } from "@/features/sites/components/sites-list";
import { MyDueAudits } from "@/features/walkthroughs/components/my-due-audits";
import { useAuthorization } from "@/lib/authorization";

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
        {can("create:site:network") ? (
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
      {can("resend:mail:network") ? (
        <UndeliveredMailNotice href={paths.undeliveredMail.getHref()} />
      ) : null}
      {canAnywhere("work:action:site") ? <MyActions actionHref={paths.action.getHref} /> : null}
      {canAnywhere("verify:action:site") ? (
        <ActionsToCheck actionHref={paths.action.getHref} />
      ) : null}
      {canAnywhere("conduct:audit:site") ? (
        <MyDueAudits startHref={(spaceId) => paths.startAudit.getHref(spaceId)} />
      ) : null}
      <SitesList />
      {can("create:site:network") ? <RetiredSites /> : null}
    </>
  );
}
