import { Link } from "react-router-dom";

import { Card } from "@/components/ui/card";
import { Spinner } from "@/components/ui/spinner";
import { cn } from "@/lib/cn";

import { useMyChecks } from "../api/get-my-checks";
import { dueText } from "../lib/action-labels";
import { OverdueMark, SeverityBadge, StateBadge } from "./action-badges";

export interface ActionsToCheckProps {
  actionHref: (actionId: string) => string;
}

/**
 * Fixes a facilities lead has asked to have checked at the auditor's sites: the home page shows
 * them whether or not the e-mail that announced them arrived.
 */
const firstFew = 6;

export function ActionsToCheck({ actionHref }: ActionsToCheckProps) {
  const { data, isPending, isError, refetch } = useMyChecks();
  return (
    <section aria-labelledby="actions-to-check-heading" className="mb-6">
      <h2 id="actions-to-check-heading" className="text-lg font-semibold tracking-tight">
        Fixes to check
      </h2>
      {isPending ? (
        <Spinner label="Loading fixes to check…" className="py-4" />
      ) : isError ? (
        <Card className="mt-3">
          <p className="text-ink-muted">The fixes to check could not be loaded.</p>
          <button
            type="button"
            className="mt-2 min-h-tap font-semibold text-brand-700"
            onClick={() => void refetch()}
          >
            Try again
          </button>
        </Card>
      ) : data.length === 0 ? (
        <Card className="mt-3">
          <p className="text-ink-muted">No fixes are waiting for your check.</p>
        </Card>
      ) : (
        <ul aria-label="Fixes to check" className="mt-3 grid gap-3 md:grid-cols-2">
          {data.slice(0, firstFew).map((action) => (
            <li key={action.id} aria-label={action.title}>
              <Link
                to={actionHref(action.id)}
                className={cn(
                  "flex flex-col gap-2 rounded-card border bg-surface p-4 shadow-sm transition-colors hover:bg-brand-50 focus-visible:outline-2 focus-visible:outline-brand-600",
                  action.overdue ? "border-verdict-not-ready border-l-8" : "border-surface-line",
                )}
              >
                <span className="text-lg font-semibold text-ink">{action.title}</span>
                <span className="text-sm text-ink-muted">
                  {action.spaceName} · {action.floorName} · {action.siteName}
                </span>
                <span className="text-sm">
                  Due <span className="font-semibold">{dueText(action)}</span>
                  {action.assignee ? <> · fixed by {action.assignee.name}</> : null}
                </span>
                <span className="flex flex-wrap gap-2">
                  <SeverityBadge severity={action.severity} />
                  {action.overdue ? <OverdueMark /> : null}
                  <StateBadge state={action.state} />
                </span>
              </Link>
            </li>
          ))}
        </ul>
      )}
      {data && data.length > firstFew ? (
        <p className="mt-2 text-sm text-ink-muted">
          And {data.length - firstFew} more in each site&apos;s action list.
        </p>
      ) : null}
    </section>
  );
}
