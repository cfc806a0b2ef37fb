import type { ScheduleEntry } from "@shared/schemas/audits";
import { zoneTypeLabels } from "@shared/zones";
import { type ReactNode, useId, useState } from "react";
import { Link } from "react-router-dom";

import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button, buttonStyles } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { ClockIcon } from "@/components/ui/icons";
import { Spinner } from "@/components/ui/spinner";
import { TextField } from "@/components/ui/text-field";
import { TextLink } from "@/components/ui/text-link";
import { VerdictBadge } from "@/components/ui/verdict-badge";
import { cn } from "@/lib/cn";
import { formatDateTime } from "@/lib/format";
import { parseNumberText } from "@/lib/form-values";

import { useSiteSchedule } from "../api/get-site-schedule";
import { useSetCadence } from "../api/set-cadence";
import { describeDue, dueNow, orderByDue } from "../lib/due-order";
import { isObservedZone } from "../lib/observation-flow";
import { KeptFreshness, NotKeptHere } from "./kept-freshness";

export interface DueLinks {
  startHref: (spaceId: string) => string;
  historyHref: (spaceId: string) => string;
  /** Where to observe putting on or removal, shown for donning zones, doffing areas and anterooms. */
  observeHref?: (spaceId: string) => string;
  /**
   * The space's live state where the page knows one (a room out of negative pressure now): shown
   * first, ahead of what its last audit said.
   */
  liveState?: (spaceId: string) => ReactNode;
}

const stateLabels: Record<ScheduleEntry["state"], string> = {
  overdue: "Overdue",
  due_soon: "Due soon",
  ok: "Up to date",
};

function DueState({ entry }: { entry: ScheduleEntry }) {
  return (
    <p
      className={cn(
        "flex flex-wrap items-center gap-x-1.5 text-sm",
        entry.state === "overdue" ? "font-semibold text-verdict-not-ready" : "text-ink-muted",
      )}
    >
      <ClockIcon />
      <span>
        {entry.state === "ok"
          ? `Up to date · ${describeDue(entry).toLowerCase()}`
          : describeDue(entry)}
      </span>
    </p>
  );
}

function CadenceEditor({ siteId, entry }: { siteId: string; entry: ScheduleEntry }) {
  const [open, setOpen] = useState(false);
  const [days, setDays] = useState(String(entry.cadenceDays));
  const [problem, setProblem] = useState<string | null>(null);
  const save = useSetCadence(siteId);

  if (!open) {
    return (
      <Button variant="quiet" className="px-3" onClick={() => setOpen(true)}>
        Change interval
      </Button>
    );
  }
  return (
    <form
      className="flex w-full flex-wrap items-end gap-3"
      onSubmit={(event) => {
        event.preventDefault();
        const value = parseNumberText(days);
        if (value === undefined || !Number.isInteger(value) || value < 1 || value > 366) {
          setProblem("A whole number of days from 1 to 366.");
          return;
        }
        setProblem(null);
        save.mutate(
          { spaceId: entry.spaceId, cadenceDays: value },
          {
            onSuccess: () => setOpen(false),
            onError: (error) => setProblem(error.message),
          },
        );
      }}
    >
      <TextField
        label="Audit every (days)"
        inputMode="numeric"
        className="w-40"
        value={days}
        error={problem ?? undefined}
        onChange={(event) => setDays(event.target.value)}
      />
      <Button type="submit" disabled={save.isPending}>
        Save interval
      </Button>
      <Button variant="secondary" onClick={() => setOpen(false)}>
        Cancel
      </Button>
    </form>
  );
}

interface DueItemProps extends DueLinks {
  siteId: string;
  entry: ScheduleEntry;
  canStart: boolean;
  canChangeCadence: boolean;
}

function DueItem({
  siteId,
  entry,
  canStart,
  canChangeCadence,
  startHref,
  historyHref,
  observeHref,
  liveState,
}: DueItemProps) {
  const headingId = useId();
  const live = liveState?.(entry.spaceId) ?? null;
  const verdict = entry.verdict ? (
    <VerdictBadge verdict={entry.verdict} />
  ) : (
    <Badge tone="muted">No audit yet</Badge>
  );
  return (
    <li
      aria-labelledby={headingId}
      className={cn(
        "rounded-lg border bg-surface p-3",
        entry.state === "overdue" || live
          ? "border-l-4 border-surface-line border-l-verdict-not-ready"
          : "border-surface-line",
      )}
    >
      <div className="flex flex-wrap items-start justify-between gap-2">
        <div className="min-w-0">
          <h3 id={headingId} className="font-semibold text-brand-800">
            {entry.spaceName}
          </h3>
          <p className="text-sm text-ink-muted">
            {zoneTypeLabels[entry.zoneType]} · {entry.floorName}
          </p>
        </div>
        {live ?? verdict}
      </div>
      {live ? (
        <p className="mt-1 flex flex-wrap items-center gap-1.5 text-sm text-ink-muted">
          Last audit: {verdict}
        </p>
      ) : null}
      <div className="mt-2 flex flex-col gap-0.5">
        <DueState entry={entry} />
        <p className="text-sm text-ink-muted">
          Every {entry.cadenceDays} {entry.cadenceDays === 1 ? "day" : "days"}
          {entry.lastAuditAt
            ? ` · last audited ${formatDateTime(entry.lastAuditAt)}${entry.lastAuditorName ? ` by ${entry.lastAuditorName}` : ""}`
            : ""}
        </p>
      </div>
      <div className="mt-3 flex flex-wrap items-center gap-2">
        {canStart ? (
          <Link
            to={startHref(entry.spaceId)}
            aria-describedby={headingId}
            className={buttonStyles({ className: "min-w-36" })}
          >
            Start audit
          </Link>
        ) : null}
        {canStart && observeHref && isObservedZone(entry.zoneType) ? (
          <Link
            to={observeHref(entry.spaceId)}
            aria-describedby={headingId}
            className={buttonStyles({ variant: "secondary", className: "px-3" })}
          >
            Observe putting on or removal
          </Link>
        ) : null}
        <Link
          to={historyHref(entry.spaceId)}
          aria-describedby={headingId}
          className={buttonStyles({ variant: "quiet", className: "px-3" })}
        >
          Audit history
        </Link>
        {canChangeCadence ? <CadenceEditor siteId={siteId} entry={entry} /> : null}
      </div>
    </li>
  );
}

export interface DueListProps extends DueLinks {
  siteId: string;
  entries: readonly ScheduleEntry[];
  canStart: boolean;
  canChangeCadence?: boolean;
  label: string;
}

/** Spaces in the order given, each with its due state, last verdict and the way to audit it. */
export function DueList({
  siteId,
  entries,
  canStart,
  canChangeCadence = false,
  label,
  ...links
}: DueListProps) {
  return (
    <ul aria-label={label} className="flex flex-col gap-2">
      {entries.map((entry) => (
        <DueItem
          key={entry.spaceId}
          siteId={siteId}
          entry={entry}
          canStart={canStart}
          canChangeCadence={canChangeCadence}
          {...links}
        />
      ))}
    </ul>
  );
}

function ScheduleProblem({ error, retry }: { error: Error; retry: () => void }) {
  return (
    <Alert role="alert" tone="error" title="We could not load what is due">
      <p>{error.message}</p>
      <Button variant="secondary" className="mt-3" onClick={retry}>
        Try again
      </Button>
    </Alert>
  );
}

export interface DueSectionProps extends DueLinks {
  siteId: string;
  canStart: boolean;
  /** Where the whole list lives. */
  allHref: string;
  /** More links for the section's foot, such as printing the QR codes. */
  actions?: ReactNode;
  /** How many of the most urgent spaces to show. */
  limit?: number;
}

/** The site page's short list: what to audit next. */
export function DueSection({
  siteId,
  canStart,
  allHref,
  actions,
  limit = 5,
  ...links
}: DueSectionProps) {
  const headingId = useId();
  const schedule = useSiteSchedule(siteId);
  const due = schedule.data ? dueNow(schedule.data) : [];
  const overdue = due.filter((entry) => entry.state === "overdue").length;
  // A room that needs someone now (its pressure) comes first, whatever its last audit said.
  const live = (schedule.data ?? []).filter((entry) => links.liveState?.(entry.spaceId) != null);
  const shown = [...live, ...due.filter((entry) => !live.includes(entry))].slice(0, limit);

  return (
    <Card>
      <section aria-labelledby={headingId} className="flex flex-col gap-3">
        <div className="flex flex-wrap items-baseline justify-between gap-2">
          <h2 id={headingId} className="text-lg font-semibold">
            Due for audit
          </h2>
          {schedule.data && due.length > 0 ? (
            <p className="text-sm text-ink-muted">
              {overdue > 0 ? `${overdue} overdue · ` : ""}
              {due.length} due
            </p>
          ) : null}
        </div>
        {schedule.data !== undefined ? (
          <KeptFreshness updatedAt={schedule.dataUpdatedAt} failed={schedule.isError} />
        ) : null}
        {schedule.isPending && schedule.fetchStatus === "paused" ? (
          <NotKeptHere what="This site's due list" />
        ) : schedule.isPending ? (
          <Spinner label="Loading what is due…" />
        ) : null}
        {schedule.isError && schedule.data === undefined ? (
          <ScheduleProblem error={schedule.error} retry={() => void schedule.refetch()} />
        ) : null}
        {schedule.data && shown.length === 0 ? (
          <p className="text-ink-muted">Nothing is due: every space here has a recent audit.</p>
        ) : null}
        {shown.length > 0 ? (
          <DueList
            siteId={siteId}
            entries={shown}
            canStart={canStart}
            label="Spaces due for audit"
            {...links}
          />
        ) : null}
        <div className="flex flex-wrap items-center gap-x-5 gap-y-2">
          <TextLink to={allHref} className="inline-flex min-h-tap items-center">
            {due.length > limit
              ? `All ${due.length} due, and every other space`
              : "All spaces and due dates"}
          </TextLink>
          {actions}
        </div>
      </section>
    </Card>
  );
}

export interface SchedulePanelProps extends DueLinks {
  siteId: string;
  canStart: boolean;
  canChangeCadence: boolean;
}

/** Every space of the site, grouped: overdue, due soon, up to date. */
export function SchedulePanel({
  siteId,
  canStart,
  canChangeCadence,
  ...links
}: SchedulePanelProps) {
  const schedule = useSiteSchedule(siteId);
  if (schedule.data === undefined && schedule.fetchStatus === "paused") {
    return <NotKeptHere what="This site's due list" />;
  }
  if (schedule.isPending) return <Spinner label="Loading what is due…" className="py-6" />;
  // Kept on the phone and shown, even when Lintel cannot be reached for a newer copy.
  if (schedule.data === undefined) {
    return <ScheduleProblem error={schedule.error} retry={() => void schedule.refetch()} />;
  }
  const ordered = orderByDue(schedule.data);
  if (ordered.length === 0) {
    return (
      <p className="text-ink-muted">
        This site has no spaces yet. Once spaces are drawn on a floor plan, they appear here with
        their due dates.
      </p>
    );
  }
  const groups = (["overdue", "due_soon", "ok"] as const)
    .map((state) => ({ state, entries: ordered.filter((entry) => entry.state === state) }))
    .filter((group) => group.entries.length > 0);

  return (
    <div className="flex flex-col gap-6">
      <KeptFreshness updatedAt={schedule.dataUpdatedAt} failed={schedule.isError} />
      {groups.map((group) => (
        <section key={group.state} className="flex flex-col gap-2">
          <h2 className="text-lg font-semibold">
            {stateLabels[group.state]}{" "}
            <span className="font-normal text-ink-muted">({group.entries.length})</span>
          </h2>
          <DueList
            siteId={siteId}
            entries={group.entries}
            canStart={canStart}
            canChangeCadence={canChangeCadence}
            label={stateLabels[group.state]}
            {...links}
          />
        </section>
      ))}
    </div>
  );
}
