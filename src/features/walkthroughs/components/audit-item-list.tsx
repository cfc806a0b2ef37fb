import type { ChecklistItem } from "@shared/schemas/checklists";

import { cn } from "@/lib/cn";

import type { AnswerFields } from "../lib/answer-rules";
import { OutcomeLabel } from "./answer-summary";

export interface AuditItemListProps {
  items: readonly ChecklistItem[];
  answers: ReadonlyMap<string, AnswerFields>;
  currentIndex: number;
  /** Items with something to put right, marked in the list. */
  flagged: ReadonlySet<string>;
  onOpen: (index: number) => void;
}

/** Every item on one screen, compact: where each stands, and a tap to open it. */
export function AuditItemList({
  items,
  answers,
  currentIndex,
  flagged,
  onOpen,
}: AuditItemListProps) {
  return (
    <ol aria-label="All items" className="flex flex-col gap-1.5">
      {items.map((item, index) => (
        <li key={item.id}>
          <button
            type="button"
            aria-current={index === currentIndex ? "step" : undefined}
            onClick={() => onOpen(index)}
            className={cn(
              "flex min-h-tap w-full items-start gap-3 rounded-lg border bg-surface px-3 py-2.5 text-left hover:bg-brand-50",
              index === currentIndex ? "border-brand-600" : "border-surface-line",
              flagged.has(item.id) && "border-l-4 border-l-verdict-not-ready",
            )}
          >
            <span className="w-6 shrink-0 text-ink-muted tabular-nums">{index + 1}.</span>
            <span className="min-w-0 flex-1">
              <span className="line-clamp-2">{item.text}</span>
              <span className="mt-0.5 block text-xs text-ink-muted capitalize">
                {item.severity}
                {flagged.has(item.id) ? " · needs attention" : ""}
              </span>
            </span>
            <OutcomeLabel outcome={answers.get(item.id)?.outcome ?? null} />
          </button>
        </li>
      ))}
    </ol>
  );
}
