import type { ChecklistItem } from "@shared/schemas/checklists";
import { type Ref, useId, useRef, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { CautionNote } from "@/components/ui/caution-note";

import { AuditNotReadyError } from "../hooks/use-audit-actions";
import type { AnswerFields, AuditReview, ItemProblem } from "../lib/answer-rules";

function counts(items: readonly ChecklistItem[], answers: ReadonlyMap<string, AnswerFields>) {
  let passed = 0;
  let failed = 0;
  let notApplicable = 0;
  for (const item of items) {
    const outcome = answers.get(item.id)?.outcome;
    if (outcome === "pass") passed += 1;
    else if (outcome === "fail") failed += 1;
    else if (outcome === "not_applicable") notApplicable += 1;
  }
  return { passed, failed, notApplicable, answered: passed + failed + notApplicable };
}

function ProblemList({
  label,
  problems,
  onOpenItem,
}: {
  label: string;
  problems: readonly ItemProblem[];
  onOpenItem: (index: number) => void;
}) {
  const headingId = useId();
  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-2">
      <h3 id={headingId} className="font-semibold">
        {label} ({problems.length})
      </h3>
      <ul aria-labelledby={headingId} className="flex flex-col gap-1.5">
        {problems.map((problem) => (
          <li key={problem.item.id}>
            <button
              type="button"
              onClick={() => onOpenItem(problem.index)}
              className="flex min-h-tap w-full flex-col items-start rounded-lg border border-surface-line border-l-4 border-l-verdict-not-ready bg-surface px-3 py-2 text-left hover:bg-brand-50"
            >
              <span>
                <span className="text-ink-muted tabular-nums">Item {problem.index + 1}: </span>
                {problem.item.text}
              </span>
              <span className="text-sm font-semibold text-verdict-not-ready">
                {problem.message}
              </span>
            </button>
          </li>
        ))}
      </ul>
    </section>
  );
}

export interface AuditReviewPanelProps {
  items: readonly ChecklistItem[];
  answers: ReadonlyMap<string, AnswerFields>;
  review: AuditReview;
  headingRef?: Ref<HTMLHeadingElement>;
  onOpenItem: (index: number) => void;
  onSubmit: () => Promise<void>;
}

/** What is left to do before the audit can go, then the one way to submit it. */
export function AuditReviewPanel({
  items,
  answers,
  review,
  headingRef,
  onOpenItem,
  onSubmit,
}: AuditReviewPanelProps) {
  const headingId = useId();
  const [refused, setRefused] = useState(false);
  const [busy, setBusy] = useState(false);
  const [problem, setProblem] = useState<string | null>(null);
  const lists = useRef<HTMLDivElement>(null);
  const tally = counts(items, answers);

  const submit = async () => {
    setBusy(true);
    setProblem(null);
    setRefused(false);
    try {
      await onSubmit();
    } catch (error) {
      setBusy(false);
      if (error instanceof AuditNotReadyError) {
        setRefused(true);
        lists.current?.querySelector("button")?.focus();
        return;
      }
      setProblem(error instanceof Error ? error.message : "The audit could not be submitted.");
    }
  };

  return (
    <section aria-labelledby={headingId} className="flex flex-col gap-5">
      <div>
        <h2
          id={headingId}
          ref={headingRef}
          tabIndex={-1}
          className="text-xl font-semibold outline-none"
        >
          Review and submit
        </h2>
        <p className="mt-1 text-ink-muted">
          {tally.answered} of {items.length} answered · {tally.passed} passed · {tally.failed}{" "}
          failed · {tally.notApplicable} not applicable
        </p>
      </div>

      <div ref={lists} className="flex flex-col gap-5 empty:hidden">
        {review.unanswered.length > 0 ? (
          <ProblemList label="Not answered" problems={review.unanswered} onOpenItem={onOpenItem} />
        ) : null}
        {review.problems.length > 0 ? (
          <ProblemList label="Needs attention" problems={review.problems} onOpenItem={onOpenItem} />
        ) : null}
      </div>

      {review.ready ? (
        <Alert tone="info" title="Everything is answered">
          <p>
            {review.failed.length === 0
              ? "Nothing failed."
              : `${review.failed.length} ${review.failed.length === 1 ? "item failed" : "items failed"}.`}{" "}
            Once submitted, the audit gets its verdict and can no longer be changed. Without a
            connection it is kept on this phone and sent as soon as there is one.
          </p>
        </Alert>
      ) : null}
      {refused ? (
        <Alert role="alert" tone="error" title="Not ready to submit">
          <p>Answer or put right the items listed above, then submit again.</p>
        </Alert>
      ) : null}
      {problem ? (
        <Alert role="alert" tone="error" title="Not submitted">
          <p>{problem}</p>
        </Alert>
      ) : null}

      <Button
        size="lg"
        className="w-full sm:w-auto sm:self-start"
        disabled={busy}
        onClick={() => void submit()}
      >
        Submit audit
      </Button>
      <CautionNote />
    </section>
  );
}
