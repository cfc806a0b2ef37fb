import { zoneTypeLabels } from "@shared/zones";
import { Link } from "react-router-dom";

import { buttonStyles } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Spinner } from "@/components/ui/spinner";
import { VerdictBadge } from "@/components/ui/verdict-badge";
import { cn } from "@/lib/cn";

import { useMyDue } from "../api/get-my-due";
import { describeDue } from "../lib/due-order";
import { KeptFreshness, NotKeptHere } from "./kept-freshness";

export interface MyDueAuditsProps {
  startHref: (spaceId: string) => string;
}

/** The auditor's own round: what is overdue or due soon at every site where they audit. */
export function MyDueAudits({ startHref }: MyDueAuditsProps) {
  const { data, isPending, isError, fetchStatus, dataUpdatedAt } = useMyDue();
  return (
    <Card className="mb-6">
      <h2 className="text-lg font-semibold">Due for you</h2>
      {data !== undefined ? (
        <KeptFreshness updatedAt={dataUpdatedAt} failed={isError} className="mt-2" />
      ) : null}
      {isPending && fetchStatus === "paused" ? (
        <NotKeptHere what="What is due for you" />
      ) : isPending ? (
        <Spinner label="Loading what is due…" />
      ) : data === undefined ? (
        <p className="mt-2 text-ink-muted">
          What is due could not be loaded. Try again in a moment.
        </p>
      ) : data.length === 0 ? (
        <p className="mt-2 text-ink-muted">Nothing is due at your sites right now.</p>
      ) : (
        <ul aria-label="Due for you" className="mt-3 divide-y divide-surface-line">
          {data.slice(0, 8).map((entry) => (
            <li
              key={entry.spaceId}
              aria-label={entry.spaceName}
              className="flex flex-wrap items-center justify-between gap-3 py-3"
            >
              <div>
                <p className="font-semibold">{entry.spaceName}</p>
                <p className="text-sm text-ink-muted">
                  {zoneTypeLabels[entry.zoneType]} · {entry.siteName} · {entry.floorName}
                </p>
                <p
                  className={cn(
                    "text-sm",
                    entry.state === "overdue"
                      ? "font-semibold text-verdict-not-ready"
                      : "text-ink-muted",
                  )}
                >
                  {describeDue(entry)}
                </p>
              </div>
              <div className="flex items-center gap-2">
                {entry.verdict ? <VerdictBadge verdict={entry.verdict} /> : null}
                <Link to={startHref(entry.spaceId)} className={buttonStyles()}>
                  Start audit
                </Link>
              </div>
            </li>
          ))}
        </ul>
      )}
      {data && data.length > 8 ? (
        <p className="mt-2 text-sm text-ink-muted">
          And {data.length - 8} more on each site's due list.
        </p>
      ) : null}
    </Card>
  );
}
