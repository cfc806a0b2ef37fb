import type { Audit } from "@shared/schemas/audits";
import type { ReactNode } from "react";
import { Link } from "react-router-dom";

import { Alert } from "@/components/ui/alert";
import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { CautionNote } from "@/components/ui/caution-note";
import { EmptyState } from "@/components/ui/empty-state";
import { PageSkeleton } from "@/components/ui/skeleton";
import { Spinner } from "@/components/ui/spinner";
import { VerdictBadge } from "@/components/ui/verdict-badge";
import { isApiError } from "@/lib/api-client";
import { formatDateTime } from "@/lib/format";

import { useSpaceAudits } from "../api/get-space-audits";
import { usePhoneAuditsForSpace } from "../hooks/use-local-audit";
import { formatScore } from "../lib/answer-rules";

function AuditRow({ audit, href }: { audit: Audit; href: string }) {
  const when = audit.submittedAt ?? audit.startedAt;
  return (
    <li>
      <Link
        to={href}
        className="flex min-h-tap flex-wrap items-center justify-between gap-x-4 gap-y-1 rounded-lg border border-surface-line bg-surface px-3 py-3 hover:bg-brand-50"
      >
        <span className="min-w-0">
          <span className="block font-semibold text-brand-800">{formatDateTime(when)}</span>
          <span className="block text-sm text-ink-muted">
            {audit.auditorName} · checklist version {audit.checklistVersion}
          </span>
        </span>
        <span className="flex items-center gap-3">
          {audit.status === "submitted" && audit.verdict ? (
            <>
              <VerdictBadge verdict={audit.verdict} />
              <span className="font-semibold tabular-nums">{formatScore(audit.score)}</span>
            </>
          ) : (
            <Badge tone="muted">In progress</Badge>
          )}
        </span>
      </Link>
    </li>
  );
}

export interface AuditHistoryProps {
  spaceId: string;
  auditHref: (auditId: string) => string;
  /** Start audit, for people who may audit at the space's site (null until it is known). */
  startAction?: (siteId: string | null) => ReactNode;
  backLink?: (siteId: string | null) => ReactNode;
  /** Shown above the audits: the room's live pressure, composed by the page. */
  beforeAudits?: ReactNode;
}

/** A space's audits, newest first, with any still waiting on this phone at the top. */
export function AuditHistory({
  spaceId,
  auditHref,
  startAction,
  backLink,
  beforeAudits,
}: AuditHistoryProps) {
  const audits = useSpaceAudits(spaceId);
  const onPhone = usePhoneAuditsForSpace(spaceId);
  const listed = new Set(
    (audits.data ?? []).filter((audit) => audit.status === "submitted").map((audit) => audit.id),
  );
  const waiting = onPhone.filter((audit) => !listed.has(audit.auditId));
  const spaceName =
    audits.data?.[0]?.spaceName ?? onPhone[0]?.detail?.audit.spaceName ?? onPhone[0]?.spaceName;
  const siteId = audits.data?.[0]?.siteId ?? onPhone[0]?.detail?.audit.siteId ?? null;
  const retiredAt = audits.data?.[0]?.spaceRetiredAt ?? null;

  if (audits.isError && isApiError(audits.error) && audits.error.status === 404) {
    return (
      <EmptyState
        headingLevel={1}
        title="This space is not available"
        description="It may have been removed, or it belongs to a site where you hold no role."
        action={backLink?.(null)}
      />
    );
  }

  // The heading, the start button and the list all wait on the audits: drawn once, nothing moves.
  if (audits.isPending && onPhone.length === 0)
    return <PageSkeleton label="Loading audits…" blocks={[3.5, 16]} />;

  return (
    <>
      <title>{`${spaceName ? `${spaceName} · ` : ""}Audit history · Lintel`}</title>
      {backLink ? <p className="text-sm">{backLink(siteId)}</p> : null}
      <div className="mt-2 mb-6 flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-2xl font-bold tracking-tight md:text-3xl">
            {spaceName ?? "Audit history"}
          </h1>
          {spaceName ? <p className="mt-1 text-ink-muted">Audit history</p> : null}
        </div>
        {retiredAt ? <Badge tone="muted">Retired</Badge> : startAction?.(siteId)}
      </div>
      {retiredAt ? (
        <Alert tone="info" className="mb-6">
          This space was retired on {formatDateTime(retiredAt)}. Its audits stay here and in the
          committee&apos;s figures; it takes no new audits unless an administrator restores it.
        </Alert>
      ) : null}

      <div className="flex flex-col gap-6">
        {beforeAudits}
        {waiting.length > 0 ? (
          <Card className="bg-brand-50">
            <h2 className="text-lg font-semibold">On this phone</h2>
            <ul className="mt-2 flex flex-col gap-2">
              {waiting.map((audit) => (
                <li key={audit.auditId}>
                  <Link
                    to={auditHref(audit.auditId)}
                    className="flex min-h-tap flex-wrap items-center justify-between gap-2 rounded-lg border border-surface-line bg-surface px-3 py-3 hover:bg-brand-50"
                  >
                    <span className="font-semibold text-brand-800">
                      Started {formatDateTime(audit.startedAt)}
                    </span>
                    <Badge tone="pending">
                      {audit.state === "draft" ? "Draft — continue" : "Submitted, waiting to sync"}
                    </Badge>
                  </Link>
                </li>
              ))}
            </ul>
          </Card>
        ) : null}

        <section aria-labelledby="audits-heading" className="flex flex-col gap-2">
          <h2 id="audits-heading" className="text-lg font-semibold">
            Audits
          </h2>
          {audits.isPending ? <Spinner label="Loading audits…" /> : null}
          {audits.isError ? (
            <Alert role="alert" tone="error" title="We could not load the audits">
              <p>{audits.error.message}</p>
              <Button variant="secondary" className="mt-3" onClick={() => void audits.refetch()}>
                Try again
              </Button>
            </Alert>
          ) : null}
          {audits.data && audits.data.length === 0 ? (
            <p className="text-ink-muted">No audits of this space yet.</p>
          ) : null}
          {audits.data && audits.data.length > 0 ? (
            <ol aria-labelledby="audits-heading" className="flex flex-col gap-2">
              {audits.data.map((audit) => (
                <AuditRow key={audit.id} audit={audit} href={auditHref(audit.id)} />
              ))}
            </ol>
          ) : null}
        </section>
        <CautionNote />
      </div>
    </>
  );
}
