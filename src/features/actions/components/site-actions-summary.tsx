import { Link } from "react-router-dom";

import { buttonStyles } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Spinner } from "@/components/ui/spinner";

import { useSiteActions } from "../api/get-site-actions";

export interface SiteActionsSummaryProps {
  siteId: string;
  listHref: string;
}

/** How many of the site's actions are not done yet and overdue, with the way to the full list. */
export function SiteActionsSummary({ siteId, listHref }: SiteActionsSummaryProps) {
  const unfinished = useSiteActions(siteId, { state: "unfinished" });
  const overdue = unfinished.data?.filter((action) => action.overdue).length ?? 0;
  const toCheck = unfinished.data?.filter((action) => action.state === "to_check").length ?? 0;
  return (
    <Card>
      <h2 className="text-lg font-semibold">Corrective actions</h2>
      <p className="mt-1 text-ink-muted">
        Every failed item becomes an action with an owner and a due time, followed until an auditor
        confirms the fix.
      </p>
      {unfinished.isPending ? (
        <Spinner label="Counting actions…" className="py-3" />
      ) : unfinished.isError ? (
        <p className="mt-3 text-ink-muted">The actions could not be counted just now.</p>
      ) : (
        <dl className="mt-4 grid grid-cols-3 gap-3 text-center">
          <div className="rounded-lg bg-surface-sunken p-3">
            <dt className="text-sm text-ink-muted">Not done</dt>
            <dd data-testid="open-actions-count" className="text-2xl font-bold">
              {unfinished.data.length}
            </dd>
          </div>
          <div className="rounded-lg bg-surface-sunken p-3">
            <dt className="text-sm text-ink-muted">Overdue</dt>
            <dd
              data-testid="overdue-actions-count"
              className={
                overdue > 0 ? "text-2xl font-bold text-verdict-not-ready" : "text-2xl font-bold"
              }
            >
              {overdue}
            </dd>
          </div>
          <div className="rounded-lg bg-surface-sunken p-3">
            <dt className="text-sm text-ink-muted">Fix to check</dt>
            <dd className="text-2xl font-bold">{toCheck}</dd>
          </div>
        </dl>
      )}
      <Link to={listHref} className={buttonStyles({ variant: "secondary", className: "mt-4" })}>
        See all corrective actions
      </Link>
    </Card>
  );
}
