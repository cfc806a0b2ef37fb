import type { Outcome } from "@shared/calc/verdict";
import type { AuditDetail } from "@shared/schemas/audits";
import type { ChecklistItem } from "@shared/schemas/checklists";
import type { ReactNode } from "react";

import { cn } from "@/lib/cn";

import { auditImageHref } from "../api/upload-audit-photo";
import type { AnswerFields } from "../lib/answer-rules";
import type { LocalPhoto } from "../lib/offline-store";
import { formatReading, fromStoredUnit } from "../lib/reading-units";
import { OutcomeIcon, outcomeStates, SeverityBadge } from "./answer-controls";
import { PhotoThumb } from "./photo-picker";

export interface AnswerRow {
  item: ChecklistItem;
  outcome: Outcome | null;
  /** The reading, count or choice, in the auditor's own terms. */
  entry: string | null;
  note: string | null;
  photos: ReactNode;
}

function entryText(item: ChecklistItem, fields: AnswerFields): string | null {
  if (item.response === "reading" && fields.value !== null && fields.unit !== null) {
    return formatReading(fields.value, fields.unit);
  }
  if (item.response === "count" && fields.count !== null) return `Count: ${fields.count}`;
  if (item.response === "choice" && fields.choice !== null) {
    return item.choices?.find((choice) => choice.value === fields.choice)?.label ?? fields.choice;
  }
  return null;
}

/** Rows from what this phone holds: readings as typed, photos from the phone while it has them. */
export function rowsFromPhone(
  items: readonly ChecklistItem[],
  answers: ReadonlyMap<string, AnswerFields>,
  photos: readonly LocalPhoto[],
): AnswerRow[] {
  return items.map((item) => {
    const fields = answers.get(item.id);
    const itemPhotos = photos.filter((photo) => photo.itemId === item.id);
    return {
      item,
      outcome: fields?.outcome ?? null,
      entry: fields ? entryText(item, fields) : null,
      note: fields?.note ?? null,
      photos:
        itemPhotos.length > 0 ? (
          <ul aria-label="Photos" className="flex flex-wrap gap-2">
            {itemPhotos.map((photo, index) => (
              <li key={photo.id}>
                <PhotoThumb photo={photo} alt={`Photo ${index + 1} of: ${item.text}`} />
              </li>
            ))}
          </ul>
        ) : null,
    };
  });
}

/** Rows from the server's copy: readings turned back into the unit the auditor entered. */
export function rowsFromServer(detail: AuditDetail): AnswerRow[] {
  return detail.items.map((item) => {
    const answer = detail.answers.find((candidate) => candidate.itemId === item.id);
    const photos = detail.photos.filter((photo) => photo.itemId === item.id);
    const fields: AnswerFields | null = answer
      ? {
          ...answer,
          value:
            answer.value !== null && answer.unit !== null
              ? (answer.enteredValue ?? fromStoredUnit(answer.value, answer.unit))
              : answer.value,
        }
      : null;
    return {
      item,
      outcome: answer?.outcome ?? null,
      entry: fields ? entryText(item, fields) : null,
      note: answer?.note ?? null,
      photos:
        photos.length > 0 ? (
          <ul aria-label="Photos" className="flex flex-wrap gap-2">
            {photos.map((photo, index) => (
              <li key={photo.id}>
                <a
                  href={auditImageHref(photo.imageId, "display")}
                  target="_blank"
                  rel="noreferrer"
                  className="block size-20 overflow-hidden rounded-lg border border-surface-line bg-surface-sunken"
                >
                  <img
                    src={auditImageHref(photo.imageId, "thumb")}
                    alt={`Photo ${index + 1} of: ${item.text}`}
                    className="size-full object-cover"
                  />
                </a>
              </li>
            ))}
          </ul>
        ) : null,
    };
  });
}

const outcomeTone: Record<Outcome, string> = {
  pass: "text-verdict-ready",
  fail: "text-verdict-not-ready",
  not_applicable: "text-ink-muted",
};

export function OutcomeLabel({ outcome }: { outcome: Outcome | null }) {
  return (
    <span
      className={cn(
        "inline-flex items-center gap-1 text-sm font-semibold whitespace-nowrap",
        outcome ? outcomeTone[outcome] : "text-ink-muted",
      )}
    >
      <OutcomeIcon outcome={outcome} className="size-4" />
      {outcome ? outcomeStates[outcome] : "Not answered"}
    </span>
  );
}

/** Every item with its answer, note and photos: read-only. */
export function AnswerSummary({ rows, label }: { rows: readonly AnswerRow[]; label: string }) {
  return (
    <ol aria-label={label} className="flex flex-col divide-y divide-surface-line">
      {rows.map((row, index) => (
        <li key={row.item.id} className="flex flex-col gap-1.5 py-3">
          <div className="flex items-start justify-between gap-3">
            <p className="min-w-0">
              <span className="text-ink-muted tabular-nums">{index + 1}. </span>
              {row.item.text}
            </p>
            <OutcomeLabel outcome={row.outcome} />
          </div>
          <div className="flex flex-wrap items-center gap-2">
            <SeverityBadge severity={row.item.severity} />
            {row.entry ? <span className="text-sm font-semibold">{row.entry}</span> : null}
          </div>
          {row.note ? <p className="text-sm text-ink-muted">Note: {row.note}</p> : null}
          {row.photos}
        </li>
      ))}
    </ol>
  );
}
