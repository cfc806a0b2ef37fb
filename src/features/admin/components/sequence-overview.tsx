import type { SequencesResponse, SequenceVersion } from "@shared/schemas/observations";
import { useId } from "react";

import { Badge } from "@/components/ui/badge";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { formatDateTime } from "@/lib/format";

import { breachKindLabels, sequenceKindLabels } from "../lib/sequence-form";

type SequenceEntry = SequencesResponse["sequences"][number];

function StepList({ version }: { version: SequenceVersion }) {
  const steps = [...version.steps].sort((a, b) => a.position - b.position);
  return (
    <ol className="mt-2 flex flex-col divide-y divide-surface-line">
      {steps.map((step, index) => (
        <li key={step.id} className="py-2">
          <p>
            <span className="text-ink-muted tabular-nums">{index + 1}. </span>
            {step.text}
          </p>
          <p className="text-sm text-ink-muted">
            {step.handHygiene ? "Hand-hygiene moment" : "No hand-hygiene moment"}
            {step.watchFor.length > 0
              ? ` · watch for: ${step.watchFor.map((kind) => breachKindLabels[kind].toLowerCase()).join(", ")}`
              : ""}
          </p>
          {step.reference ? (
            <p className="text-xs text-ink-subtle">Reference: {step.reference}</p>
          ) : null}
        </li>
      ))}
    </ol>
  );
}

function SequenceCard({ entry, onEdit }: { entry: SequenceEntry; onEdit: (key: string) => void }) {
  const headingId = useId();
  const { published, draft } = entry;
  const shown = published ?? draft;
  if (!shown) return null;
  const note = shown.note ?? draft?.note;
  return (
    <Card>
      <section aria-labelledby={headingId} className="flex flex-col gap-3">
        <div className="flex flex-wrap items-start justify-between gap-3">
          <div className="min-w-0">
            <h2 id={headingId} className="text-lg font-semibold">
              {shown.title}
            </h2>
            <p className="text-sm text-ink-muted">
              {sequenceKindLabels[shown.kind]} ·{" "}
              {published
                ? `version ${published.version}${published.publishedAt ? `, published ${formatDateTime(published.publishedAt)}` : ""}`
                : "not published yet"}{" "}
              · {shown.steps.length} {shown.steps.length === 1 ? "step" : "steps"}
            </p>
            {note ? <p className="mt-1 text-sm font-semibold text-brand-800">{note}</p> : null}
          </div>
          <div className="flex flex-wrap items-center gap-2">
            {draft ? <Badge tone="pending">Draft of version {draft.version}</Badge> : null}
            <Button onClick={() => onEdit(entry.key)}>
              Edit draft<span className="sr-only"> of {shown.title}</span>
            </Button>
          </div>
        </div>
        {published ? (
          <details>
            <summary className="min-h-tap cursor-pointer py-2 font-semibold text-brand-800">
              Steps in version {published.version}
            </summary>
            <StepList version={published} />
          </details>
        ) : (
          <p className="text-sm text-ink-muted">
            Observers cannot choose it until its first version is published.
          </p>
        )}
      </section>
    </Card>
  );
}

export interface SequenceOverviewProps {
  sequences: SequencesResponse["sequences"];
  onEdit: (key: string) => void;
}

/** Each sequence as published, its draft if any, and the way into its next draft. */
export function SequenceOverview({ sequences, onEdit }: SequenceOverviewProps) {
  return (
    <div className="flex flex-col gap-4">
      {sequences.map((entry) => (
        <SequenceCard key={entry.key} entry={entry} onEdit={onEdit} />
      ))}
    </div>
  );
}
