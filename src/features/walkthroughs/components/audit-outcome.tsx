import type { Verdict } from "@shared/calc/verdict";
import { type ReactNode, useId } from "react";

import { Badge } from "@/components/ui/badge";
import { CautionNote } from "@/components/ui/caution-note";
import { VerdictBanner } from "@/components/ui/verdict-badge";

import { formatScore } from "../lib/answer-rules";
import { AnswerSummary, type AnswerRow } from "./answer-summary";

export interface AuditOutcomeProps {
  verdict: Verdict;
  /** Why, in words; null when the verdict was decided before reasons were kept. */
  reasons: readonly string[] | null;
  /** The version of the readiness rules that decided it; null when not recorded. */
  rulesVersion: number | null;
  score: number | null;
  /** Worked out on the phone; Lintel's server has not decided it yet. */
  onPhoneOnly: boolean;
  rows: readonly AnswerRow[];
  /** Submitted when and by whom, once known. */
  byline?: ReactNode;
  actions?: ReactNode;
}

/** The end of an audit: the verdict large, the score, and what failed. */
export function AuditOutcome({
  verdict,
  reasons,
  rulesVersion,
  onPhoneOnly,
  score,
  rows,
  byline,
  actions,
}: AuditOutcomeProps) {
  const failedId = useId();
  const reasonsId = useId();
  const failed = rows.filter((row) => row.outcome === "fail");
  return (
    <div className="flex flex-col gap-5">
      <section aria-label="Verdict" className="flex flex-col gap-3">
        {onPhoneOnly ? (
          <div className="flex flex-wrap items-center gap-2">
            <Badge tone="pending">On this phone only</Badge>
            <p className="text-sm text-ink-muted">
              Worked out on this phone. Lintel decides the verdict when the audit reaches it.
            </p>
          </div>
        ) : null}
        <VerdictBanner verdict={verdict} />
        {reasons && reasons.length > 0 ? (
          <div className="flex flex-col gap-1">
            <h2 id={reasonsId} className="text-base font-semibold">
              Why
            </h2>
            <ul aria-labelledby={reasonsId} className="list-disc pl-5 text-base">
              {reasons.map((reason) => (
                <li key={reason} className="break-words">
                  {reason}
                </li>
              ))}
            </ul>
          </div>
        ) : null}
        <p className="text-sm text-ink-muted">
          {rulesVersion === null
            ? "Decided by Lintel's readiness rules before their version was recorded."
            : `Decided by Lintel's readiness rules, version ${rulesVersion}.`}
        </p>
        <p className="text-lg">
          Score <strong className="text-2xl">{formatScore(score)}</strong>
          <span className="block text-sm text-ink-muted">
            Weighted pass rate over the items that apply (critical 5, major 3, minor 1).
          </span>
        </p>
        {byline ? <div className="text-sm text-ink-muted">{byline}</div> : null}
      </section>

      <section aria-labelledby={failedId} className="flex flex-col gap-2">
        <h2 id={failedId} className="text-lg font-semibold">
          {failed.length === 0 ? "No failed items" : `Failed items (${failed.length})`}
        </h2>
        {failed.length > 0 ? <AnswerSummary rows={failed} label="Failed items" /> : null}
      </section>

      {actions ? <div className="flex flex-wrap gap-3">{actions}</div> : null}

      <CautionNote />

      <details className="rounded-card border border-surface-line bg-surface p-4">
        <summary className="min-h-tap cursor-pointer py-2 font-semibold text-brand-800">
          All answers ({rows.length})
        </summary>
        <AnswerSummary rows={rows} label="All answers" />
      </details>
    </div>
  );
}
