import { rulesVersion } from "@shared/calc/verdict";
import type { AuditDetail } from "@shared/schemas/audits";
import type { ChecklistItem } from "@shared/schemas/checklists";
import { zoneTypeLabels } from "@shared/zones";
import { type ReactNode, useEffect, useMemo, useRef, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { CautionNote } from "@/components/ui/caution-note";
import { Spinner } from "@/components/ui/spinner";
import { cn } from "@/lib/cn";
import { formatDateTime } from "@/lib/format";

import { useAuditActions } from "../hooks/use-audit-actions";
import type { LocalAuditSnapshot } from "../hooks/use-local-audit";
import { useSyncStatus } from "../hooks/use-sync-status";
import { type AnswerFields, resultOnPhone, reviewAudit } from "../lib/answer-rules";
import { refusalsByItem } from "../lib/refusals";
import { unconfirmedAirChanges, ventilationFigures } from "../lib/ventilation-figures";
import { AnswerSummary, rowsFromPhone, rowsFromServer } from "./answer-summary";
import { AuditItemList } from "./audit-item-list";
import { AuditOutcome } from "./audit-outcome";
import { AuditReviewPanel } from "./audit-review";
import { ItemStep } from "./item-step";

type Mode = "one" | "list" | "review";

function ProgressBar({
  index,
  total,
  answered,
}: {
  index: number;
  total: number;
  answered: number;
}) {
  const label = `Item ${index + 1} of ${total}`;
  return (
    <div className="flex flex-col gap-1.5">
      <div className="flex items-baseline justify-between gap-3 text-sm">
        <p className="font-semibold">{label}</p>
        <p className="text-ink-muted">
          {answered} of {total} answered
        </p>
      </div>
      <div
        role="progressbar"
        aria-label="Position in the checklist"
        aria-valuemin={1}
        aria-valuemax={total}
        aria-valuenow={index + 1}
        aria-valuetext={label}
        className="h-2.5 overflow-hidden rounded-full bg-surface-line"
      >
        <div
          className="h-full rounded-full bg-brand-600 transition-[width]"
          style={{ width: `${((index + 1) / total) * 100}%` }}
        />
      </div>
    </div>
  );
}

function ModeSwitch({ mode, onChange }: { mode: Mode; onChange: (mode: Mode) => void }) {
  const options: { mode: Mode; label: string }[] = [
    { mode: "one", label: "One by one" },
    { mode: "list", label: "List" },
  ];
  return (
    <div
      role="group"
      aria-label="Show items"
      className="inline-flex rounded-lg border border-surface-line bg-surface p-0.5"
    >
      {options.map((option) => (
        <button
          key={option.mode}
          type="button"
          aria-pressed={mode === option.mode}
          onClick={() => onChange(option.mode)}
          className={cn(
            "min-h-tap rounded-md px-3 text-sm font-semibold",
            mode === option.mode ? "bg-brand-700 text-white" : "text-brand-800 hover:bg-brand-50",
          )}
        >
          {option.label}
        </button>
      ))}
    </div>
  );
}

function firstUnanswered(
  items: readonly ChecklistItem[],
  answers: ReadonlyMap<string, AnswerFields>,
) {
  const index = items.findIndex((item) => !answers.get(item.id)?.outcome);
  return index === -1 ? 0 : index;
}

/** What a page shows beside an item of a draft, e.g. a room's recorded pressure beside its pressure item. */
export type ItemAside = (item: AuditDetail["items"][number], detail: AuditDetail) => ReactNode;

interface DraftProps {
  auditId: string;
  detail: AuditDetail;
  snapshot: LocalAuditSnapshot;
  itemAside?: ItemAside;
}

function DraftWalkthrough({ auditId, detail, snapshot, itemAside }: DraftProps) {
  const { answers, photos, changes, audit } = snapshot;
  const items = detail.items;
  const actions = useAuditActions(auditId);
  const [mode, setMode] = useState<Mode>("one");
  const [index, setIndex] = useState(() => firstUnanswered(items, answers));
  const itemHeading = useRef<HTMLHeadingElement>(null);
  const reviewHeading = useRef<HTMLHeadingElement>(null);
  const moved = useRef(false);

  const refusals = useMemo(
    () => refusalsByItem(changes, photos, audit.submitRefusals),
    [changes, photos, audit.submitRefusals],
  );
  const photoCounts = useMemo(() => {
    const counts = new Map<string, number>();
    for (const photo of photos) counts.set(photo.itemId, (counts.get(photo.itemId) ?? 0) + 1);
    return counts;
  }, [photos]);
  const ventilation = useMemo(
    () => (detail.room ? ventilationFigures(items, answers, detail.room) : null),
    [items, answers, detail.room],
  );
  const review = useMemo(
    () =>
      reviewAudit(items, answers, photoCounts, {
        ...unconfirmedAirChanges(items, answers, ventilation),
        ...refusals,
      }),
    [items, answers, photoCounts, refusals, ventilation],
  );
  const flagged = useMemo(
    () => new Set(review.problems.map((problem) => problem.item.id)),
    [review.problems],
  );
  const removable = useMemo(
    () => new Set(photos.filter((photo) => photo.imageId === null).map((photo) => photo.id)),
    [photos],
  );

  // After moving, put focus (and the screen) on the new item or the review, not on the old button.
  useEffect(() => {
    if (!moved.current) return;
    (mode === "review" ? reviewHeading : itemHeading).current?.focus();
  }, [index, mode]);

  const go = (nextMode: Mode, nextIndex = index) => {
    moved.current = true;
    setMode(nextMode);
    setIndex(Math.max(0, Math.min(items.length - 1, nextIndex)));
  };

  if (items.length === 0) {
    return <p className="text-ink-muted">This checklist has no items.</p>;
  }
  const item = items[Math.min(index, items.length - 1)]!;
  const answered = items.filter((candidate) => answers.get(candidate.id)?.outcome).length;
  const atEnd = index >= items.length - 1;

  return (
    <div className="flex flex-col gap-5">
      <div className="flex flex-wrap items-center justify-between gap-3">
        {mode === "review" ? (
          <Button variant="secondary" onClick={() => go("one")}>
            Back to the items
          </Button>
        ) : (
          <>
            <ModeSwitch mode={mode} onChange={(next) => go(next)} />
            <Button variant="secondary" onClick={() => go("review")}>
              Review and submit
            </Button>
          </>
        )}
      </div>

      {mode === "one" ? (
        <>
          <ProgressBar index={index} total={items.length} answered={answered} />
          <ItemStep
            key={item.id}
            item={item}
            answer={answers.get(item.id)}
            photos={photos.filter((photo) => photo.itemId === item.id)}
            removablePhotos={removable}
            room={detail.room}
            ventilation={ventilation}
            refusal={refusals[item.id] ?? null}
            headingRef={itemHeading}
            onSave={(fields) => actions.answer(item.id, fields)}
            onAddPhoto={(file) => actions.addPhoto(item.id, file)}
            onRemovePhoto={actions.removePhoto}
            aside={itemAside?.(item, detail)}
          />
          <nav
            aria-label="Items"
            className="sticky bottom-0 -mx-4 grid grid-cols-2 gap-3 border-t border-surface-line bg-surface-sunken/95 px-4 pt-3 pb-[max(0.75rem,env(safe-area-inset-bottom))] backdrop-blur md:static md:mx-0 md:border-0 md:bg-transparent md:px-0"
          >
            <Button
              variant="secondary"
              size="lg"
              disabled={index === 0}
              onClick={() => go("one", index - 1)}
            >
              Back
            </Button>
            <Button size="lg" onClick={() => (atEnd ? go("review") : go("one", index + 1))}>
              Next
            </Button>
          </nav>
        </>
      ) : null}

      {mode === "list" ? (
        <>
          <p className="text-sm text-ink-muted">
            {answered} of {items.length} answered. Tap an item to answer it.
          </p>
          <AuditItemList
            items={items}
            answers={answers}
            currentIndex={index}
            flagged={flagged}
            onOpen={(opened) => go("one", opened)}
          />
          <CautionNote />
        </>
      ) : null}

      {mode === "review" ? (
        <AuditReviewPanel
          items={items}
          answers={answers}
          review={review}
          headingRef={reviewHeading}
          onOpenItem={(opened) => go("one", opened)}
          onSubmit={actions.submit}
        />
      ) : null}
    </div>
  );
}

function WaitingForChecklist({ problem }: { problem: string | null }) {
  const status = useSyncStatus();
  if (problem) {
    return (
      <Alert role="alert" tone="error" title="Lintel did not accept this audit">
        <p>{problem}</p>
      </Alert>
    );
  }
  if (status && !status.online) {
    return (
      <Alert tone="info" title="Waiting for a connection">
        <p>
          The audit is kept on this phone, but its checklist has not reached the phone yet. It
          arrives as soon as there is a connection; you can stay on this page.
        </p>
      </Alert>
    );
  }
  return <Spinner label="Getting the checklist for this space…" className="py-6" />;
}

export interface AuditWalkthroughProps {
  snapshot: LocalAuditSnapshot;
  /** Links for the end of the audit: back to the site's due list, the space's history. */
  afterLinks?: (detail: AuditDetail) => ReactNode;
  itemAside?: ItemAside;
}

/** An audit held on this phone: the walkthrough while it is a draft, the verdict once submitted. */
export function AuditWalkthrough({ snapshot, afterLinks, itemAside }: AuditWalkthroughProps) {
  const { audit, answers, photos, changes } = snapshot;
  const detail = audit.detail;
  const spaceName = detail?.audit.spaceName ?? audit.spaceName ?? "Audit";
  const startProblem = changes.find((change) => change.kind === "start" && change.problem)?.problem;
  const submitProblem = changes.find(
    (change) => change.kind === "submit" && change.problem,
  )?.problem;

  let body: ReactNode;
  if (!detail) {
    body = <WaitingForChecklist problem={startProblem?.message ?? null} />;
  } else if (audit.state === "draft") {
    body = (
      <DraftWalkthrough
        auditId={audit.auditId}
        detail={detail}
        snapshot={snapshot}
        itemAside={itemAside}
      />
    );
  } else {
    const confirmed = audit.state === "submitted" && detail.audit.verdict !== null;
    const local = resultOnPhone(detail.audit.zoneType, detail.items, answers);
    body = (
      <AuditOutcome
        verdict={confirmed ? detail.audit.verdict! : local.verdict}
        reasons={confirmed ? (detail.audit.verdictReasons ?? null) : local.reasons}
        rulesVersion={confirmed ? (detail.audit.rulesVersion ?? null) : rulesVersion}
        score={confirmed ? detail.audit.score : local.score}
        onPhoneOnly={!confirmed}
        rows={rowsFromPhone(detail.items, answers, photos)}
        byline={
          confirmed && detail.audit.submittedAt
            ? `Submitted ${formatDateTime(detail.audit.submittedAt)} by ${detail.audit.auditorName}`
            : null
        }
        actions={afterLinks?.(detail)}
      />
    );
  }

  return (
    <div className="flex flex-col gap-5">
      <div>
        <h1 className="text-2xl font-bold tracking-tight md:text-3xl">{spaceName}</h1>
        <p className="mt-1 text-ink-muted">
          {detail ? `${zoneTypeLabels[detail.audit.zoneType]} · ` : ""}Started{" "}
          {formatDateTime(audit.startedAt)}
          {detail ? ` · checklist version ${detail.audit.checklistVersion}` : ""}
        </p>
      </div>
      {detail && startProblem ? (
        <Alert role="alert" tone="error" title="Lintel did not accept this audit">
          <p>{startProblem.message}</p>
        </Alert>
      ) : null}
      {submitProblem ? (
        <Alert role="alert" tone="error" title="Lintel did not accept the submission">
          <p>{submitProblem.message}</p>
        </Alert>
      ) : null}
      {body}
    </div>
  );
}

/** A submitted audit from the server's copy (history), read-only. */
export function SubmittedAudit({
  detail,
  afterLinks,
}: {
  detail: AuditDetail;
  afterLinks?: ReactNode;
}) {
  const { audit } = detail;
  const rows = useMemo(() => rowsFromServer(detail), [detail]);
  return (
    <div className="flex flex-col gap-5">
      <div>
        <h1 className="text-2xl font-bold tracking-tight md:text-3xl">{audit.spaceName}</h1>
        <p className="mt-1 text-ink-muted">
          {zoneTypeLabels[audit.zoneType]} · checklist version {audit.checklistVersion}
        </p>
      </div>
      {audit.status === "submitted" && audit.verdict ? (
        <AuditOutcome
          verdict={audit.verdict}
          reasons={audit.verdictReasons ?? null}
          rulesVersion={audit.rulesVersion ?? null}
          score={audit.score}
          onPhoneOnly={false}
          rows={rows}
          byline={`Submitted ${audit.submittedAt ? formatDateTime(audit.submittedAt) : ""} by ${audit.auditorName}`}
          actions={afterLinks}
        />
      ) : (
        <>
          <Alert tone="info" title="In progress">
            <p>
              {audit.auditorName} started this audit {formatDateTime(audit.startedAt)}. It has not
              been submitted yet.
            </p>
          </Alert>
          <AnswerSummary rows={rows} label="Answers so far" />
        </>
      )}
    </div>
  );
}
