import type { ComponentProps, ReactNode } from "react";

import { Button } from "@/components/ui/button";
import { isApiError } from "@/lib/api-client";

/** A checkbox with its words beside it, a full tap high. */
export function Checkbox({ label, ...props }: { label: ReactNode } & ComponentProps<"input">) {
  return (
    <label className="flex min-h-tap items-center gap-3 font-semibold">
      <input type="checkbox" className="size-5 shrink-0 accent-brand-700" {...props} />
      {label}
    </label>
  );
}

/** The server's refusal in words, with the first field it named. */
export function problemText(error: unknown): string {
  if (isApiError(error)) {
    const first = Object.values(error.fields)[0];
    return first ? `${error.message} ${first}` : error.message;
  }
  return "That did not work. Please try again.";
}

export interface ReorderButtonsProps {
  index: number;
  count: number;
  /** What a screen reader hears after each button: "item 3", "step 2". */
  name: string;
  /** "Retire" for checklist items (they stay in past audits), "Remove" for steps. */
  removeLabel: string;
  onMove: (from: number, to: number) => void;
  onRemove: (index: number) => void;
  /** Whether the last remaining entry may go too. */
  canRemove?: boolean;
}

/** Move up, move down and take out one entry of an edited list. */
export function ReorderButtons({
  index,
  count,
  name,
  removeLabel,
  onMove,
  onRemove,
  canRemove = true,
}: ReorderButtonsProps) {
  return (
    <div className="flex flex-wrap gap-1">
      <Button
        variant="quiet"
        className="px-3"
        disabled={index === 0}
        onClick={() => onMove(index, index - 1)}
      >
        Move up <span className="sr-only">{name}</span>
      </Button>
      <Button
        variant="quiet"
        className="px-3"
        disabled={index === count - 1}
        onClick={() => onMove(index, index + 1)}
      >
        Move down <span className="sr-only">{name}</span>
      </Button>
      {canRemove ? (
        <Button variant="quiet" className="px-3" onClick={() => onRemove(index)}>
          {removeLabel} <span className="sr-only">{name}</span>
        </Button>
      ) : null}
    </div>
  );
}

/** The editor's buttons, kept in view above the phone's bottom bar while the list scrolls. */
export function EditorActions({ children }: { children: ReactNode }) {
  return (
    <div className="sticky bottom-16 z-10 -mx-4 flex flex-wrap gap-3 border-t border-surface-line bg-surface-sunken/95 px-4 py-3 backdrop-blur md:bottom-0">
      {children}
    </div>
  );
}
