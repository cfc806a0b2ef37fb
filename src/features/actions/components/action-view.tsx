import { formatInZone } from "@shared/calc/due";
import { zoneTypeLabels } from "@shared/zones";
import type { ActionDetail, Finding, Proof, TimelineEntry } from "@shared/schemas/actions";
import { actionStateLabels } from "@shared/schemas/actions";
import type { ReactNode } from "react";
import { Link } from "react-router-dom";

import { Alert } from "@/components/ui/alert";
import { Card } from "@/components/ui/card";
import { CautionNote } from "@/components/ui/caution-note";
import { linkStyles } from "@/components/ui/text-link";

import { closeReasonText, daysToCloseText, dueText, timelineLabels } from "../lib/action-labels";
import { actionImageHref } from "../lib/action-images";
import { OverdueMark, SeverityBadge, StateBadge } from "./action-badges";

function atSite(iso: string, timeZone: string): string {
  const at = new Date(iso);
  return Number.isNaN(at.getTime()) ? iso : formatInZone(at, timeZone);
}

function Photo({ imageId, alt }: { imageId: string; alt: string }) {
  return (
    <a
      href={actionImageHref(imageId, "display")}
      target="_blank"
      rel="noreferrer"
      className="block size-24 overflow-hidden rounded-lg border border-surface-line bg-surface-sunken focus-visible:outline-2 focus-visible:outline-brand-600"
    >
      <img
        src={actionImageHref(imageId, "thumb")}
        alt={alt}
        loading="lazy"
        className="size-full object-cover"
      />
    </a>
  );
}

function Findings({ findings, timeZone }: { findings: readonly Finding[]; timeZone: string }) {
  return (
    <Card>
      <h2 className="text-lg font-semibold">
        {findings.length === 1 ? "The finding" : `Findings (${findings.length})`}
      </h2>
      <ol className="mt-3 flex flex-col divide-y divide-surface-line">
        {findings.map((finding, index) => (
          <li key={finding.id} className="flex flex-col gap-2 py-3 first:pt-0 last:pb-0">
            <p className="text-sm text-ink-muted">
              {atSite(finding.auditedAt, timeZone)} · {finding.auditorName}
            </p>
            <p>{finding.itemText}</p>
            {finding.note ? (
              <p className="rounded-lg bg-surface-sunken px-3 py-2 text-sm">{finding.note}</p>
            ) : null}
            {finding.photos.length > 0 ? (
              <ul aria-label="Photos of the finding" className="flex flex-wrap gap-2">
                {finding.photos.map((photo, photoIndex) => (
                  <li key={photo.imageId}>
                    <Photo
                      imageId={photo.imageId}
                      alt={`Finding ${index + 1}, photo ${photoIndex + 1}`}
                    />
                  </li>
                ))}
              </ul>
            ) : null}
          </li>
        ))}
      </ol>
    </Card>
  );
}

function ProofList({ proofs, timeZone }: { proofs: readonly Proof[]; timeZone: string }) {
  const current = proofs.filter((proof) => proof.current);
  const earlier = proofs.filter((proof) => !proof.current);
  const list = (items: readonly Proof[], label: string) => (
    <ul aria-label={label} className="mt-2 flex flex-wrap gap-3">
      {items.map((proof, index) => (
        <li key={proof.id} className="flex w-24 flex-col gap-1">
          <Photo imageId={proof.imageId} alt={`${label}, photo ${index + 1}`} />
          <span className="text-xs text-ink-muted">
            {atSite(proof.createdAt, timeZone)}
            {proof.uploadedBy ? ` · ${proof.uploadedBy}` : ""}
          </span>
        </li>
      ))}
    </ul>
  );
  return (
    <Card>
      <h2 className="text-lg font-semibold">Photos of the fix</h2>
      {current.length > 0 ? (
        <>
          <h3 className="mt-3 text-sm font-semibold text-ink-muted">
            Since the fix was last sent back or reopened
          </h3>
          {list(current, "Photos of the fix now")}
        </>
      ) : (
        <p className="mt-2 text-ink-muted">
          No photo of the fix yet
          {earlier.length > 0 ? " since it was last sent back or reopened" : ""}.
        </p>
      )}
      {earlier.length > 0 ? (
        <>
          <h3 className="mt-4 text-sm font-semibold text-ink-muted">
            Earlier photos (a fix that was sent back or did not hold)
          </h3>
          {list(earlier, "Earlier photos of the fix")}
        </>
      ) : null}
    </Card>
  );
}

function Timeline({ entries, timeZone }: { entries: readonly TimelineEntry[]; timeZone: string }) {
  return (
    <Card>
      <h2 className="text-lg font-semibold">History</h2>
      <ol
        aria-label="History"
        className="mt-3 flex flex-col gap-4 border-l-2 border-brand-200 pl-4"
      >
        {entries.map((entry) => (
          <li key={entry.id} className="relative">
            <span
              aria-hidden="true"
              className="absolute top-1.5 -left-[23px] size-3 rounded-full border-2 border-surface bg-brand-600"
            />
            <p className="font-semibold">{timelineLabels[entry.kind]}</p>
            <p className="text-sm text-ink-muted">
              {atSite(entry.at, timeZone)}
              {entry.actorName ? ` · ${entry.actorName}` : ""}
              {entry.fromState && entry.toState && entry.fromState !== entry.toState
                ? ` · ${actionStateLabels[entry.fromState]} → ${actionStateLabels[entry.toState]}`
                : ""}
            </p>
            {entry.text ? (
              <p className="mt-1 rounded-lg bg-surface-sunken px-3 py-2 text-sm whitespace-pre-line">
                {entry.text}
              </p>
            ) : null}
          </li>
        ))}
      </ol>
    </Card>
  );
}

export interface ActionViewProps {
  detail: ActionDetail;
  siteHref: string;
  floorHref: string;
  /** Where the space is on the floor plan; composed by the page. */
  location: ReactNode;
  /** The moves this person may make. */
  moves: ReactNode;
}

/** A corrective action: what failed, where, by when, the proof and everything that happened. */
export function ActionView({ detail, siteHref, floorHref, location, moves }: ActionViewProps) {
  const { action, findings, proofs, timeline } = detail;
  const zone = action.siteTimeZone;
  return (
    <>
      <p className="text-sm">
        <Link to={siteHref} className={linkStyles}>
          {action.siteName}
        </Link>
      </p>
      <h1 className="mt-2 text-2xl font-bold tracking-tight md:text-3xl">{action.title}</h1>
      <p className="mt-1 text-ink-muted">
        {action.spaceName} ({zoneTypeLabels[action.zoneType]}) ·{" "}
        <Link to={floorHref} className={linkStyles}>
          {action.floorName}
        </Link>{" "}
        · {action.siteName}
      </p>
      <div className="mt-3 flex flex-wrap items-center gap-2">
        <SeverityBadge severity={action.severity} />
        <StateBadge state={action.state} />
        {action.overdue ? <OverdueMark /> : null}
      </div>
      <dl className="mt-4 grid grid-cols-1 gap-x-6 gap-y-2 text-sm min-[420px]:grid-cols-2 lg:grid-cols-4">
        <div>
          <dt className="text-ink-muted">Due</dt>
          <dd className="font-semibold">{dueText(action)}</dd>
        </div>
        <div>
          <dt className="text-ink-muted">Owner</dt>
          <dd className="font-semibold">{action.assignee?.name ?? "No one yet"}</dd>
        </div>
        <div>
          <dt className="text-ink-muted">Opened</dt>
          <dd>{atSite(action.openedAt, zone)}</dd>
        </div>
        {action.state === "done" && action.daysToClose !== null ? (
          <div>
            <dt className="text-ink-muted">Days to close</dt>
            <dd className="font-semibold">{daysToCloseText(action.daysToClose)}</dd>
          </div>
        ) : null}
        {action.state === "done" ? (
          <div>
            <dt className="text-ink-muted">How it was done</dt>
            <dd className="font-semibold">{closeReasonText(action)}</dd>
          </div>
        ) : null}
      </dl>
      {action.spaceRetiredAt ? (
        <Alert tone="info" className="mt-4">
          {action.spaceName} was retired on {atSite(action.spaceRetiredAt, zone)}. It is off the
          plan and takes no new audits; an administrator can restore it, which reopens the actions
          its retirement closed.
        </Alert>
      ) : null}

      <div className="mt-6 grid gap-6 lg:grid-cols-[minmax(0,1fr)_24rem]">
        <div className="flex min-w-0 flex-col gap-6">
          {moves}
          <Findings findings={findings} timeZone={zone} />
          <ProofList proofs={proofs} timeZone={zone} />
        </div>
        <div className="flex min-w-0 flex-col gap-6">
          <Card>
            <h2 className="text-lg font-semibold">Where it is</h2>
            <p className="mt-1 mb-3 text-sm text-ink-muted">
              {action.spaceName} on {action.floorName}, outlined on the plan.
            </p>
            {location}
          </Card>
          <Timeline entries={timeline} timeZone={zone} />
        </div>
      </div>
      <CautionNote className="mt-6" />
    </>
  );
}
