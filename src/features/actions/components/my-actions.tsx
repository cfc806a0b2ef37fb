import { Link } from "react-router-dom";

import { Card } from "@/components/ui/card";
import { Spinner } from "@/components/ui/spinner";
import { cn } from "@/lib/cn";

import { useMyActions } from "../api/get-my-actions";
import { dueText } from "../lib/action-labels";
import { OverdueMark, SeveritySymbol, StateBadge } from "./action-badges";

export interface MyActionsProps {
  actionHref: (actionId: string) => string;
  /** Show every action rather than the first few (the page of its own). */
  showAll?: boolean;
  headingLevel?: 1 | 2;
}

const firstFew = 6;

/** The facilities lead's own corrective actions, in the server's order: overdue first. */
export function MyActions({ actionHref, showAll = false, headingLevel = 2 }: MyActionsProps) {
  const { data, isPending, isError, refetch } = useMyActions();
  const Heading = headingLevel === 1 ? "h1" : "h2";
  const shown = data ? (showAll ? data : data.slice(0, firstFew)) : [];
  return (
    <section aria-labelledby="my-actions-heading" className="mb-6">
      <Heading
        id="my-actions-heading"
        className={cn(
          "font-bold tracking-tight",
          headingLevel === 1 ? "text-2xl md:text-3xl" : "text-lg font-semibold",
        )}
      >
        {headingLevel === 1 ? "Corrective actions" : "My corrective actions"}
      </Heading>
      {headingLevel === 1 ? (
        <p className="mt-1 text-ink-muted">
          The fixes you own, overdue first. Open one to start fixing it or to send a photo of the
          fix.
        </p>
      ) : null}
      {isPending ? (
        <Spinner label="Loading your actions…" className="py-4" />
      ) : isError ? (
        <Card className="mt-3">
          <p className="text-ink-muted">Your actions could not be loaded.</p>
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
          <p className="text-ink-muted">No corrective actions are waiting on you right now.</p>
        </Card>
      ) : (
        <ul aria-label="My corrective actions" className="mt-3 grid gap-3 md:grid-cols-2">
          {shown.map((action) => (
            <li key={action.id} aria-label={action.title}>
              <Link
                to={actionHref(action.id)}
                className={cn(
                  "flex min-h-24 flex-col gap-2 rounded-card border bg-surface p-4 shadow-sm transition-colors hover:bg-brand-50 focus-visible:outline-2 focus-visible:outline-brand-600",
                  action.overdue ? "border-verdict-not-ready border-l-8" : "border-surface-line",
                )}
              >
                <span className="flex items-start gap-2">
                  <SeveritySymbol severity={action.severity} className="mt-1 size-5" />
                  <span className="text-lg font-semibold text-ink">{action.title}</span>
                </span>
                <span className="text-sm text-ink-muted">
                  {action.spaceName} · {action.floorName} · {action.siteName}
                </span>
                <span className="text-sm">
                  Due <span className="font-semibold">{dueText(action)}</span>
                </span>
                <span className="flex flex-wrap gap-2">
                  {action.overdue ? <OverdueMark /> : null}
                  <StateBadge state={action.state} />
                </span>
              </Link>
            </li>
          ))}
        </ul>
      )}
      {data && !showAll && data.length > firstFew ? (
        <p className="mt-2 text-sm text-ink-muted">
          And {data.length - firstFew} more under Actions.
        </p>
      ) : null}
    </section>
  );
}
