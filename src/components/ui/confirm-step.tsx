import { type ReactNode, type RefObject, useEffect, useId, useRef } from "react";

import { cn } from "@/lib/cn";

import { Button } from "./button";
import { SpinnerGlyph } from "./spinner";

export interface ConfirmStepProps {
  title: string;
  children?: ReactNode;
  confirmLabel: string;
  cancelLabel?: string;
  onConfirm: () => void;
  onCancel: () => void;
  pending?: boolean;
  /** The button that opened this step; focus goes back to it when the step closes. */
  returnFocusRef?: RefObject<HTMLElement | null>;
  className?: string;
}

/**
 * An inline "are you sure" for changes that are hard to undo. It takes focus when it opens so a
 * screen reader reads the question, and hands focus back to its trigger when it closes.
 */
export function ConfirmStep({
  title,
  children,
  confirmLabel,
  cancelLabel = "Cancel",
  onConfirm,
  onCancel,
  pending = false,
  returnFocusRef,
  className,
}: ConfirmStepProps) {
  const titleId = useId();
  const panel = useRef<HTMLDivElement>(null);

  useEffect(() => {
    const element = panel.current;
    // The trigger stays on screen while the step is open, so the element seen now is the one to
    // return to.
    const trigger = returnFocusRef?.current;
    element?.focus();
    return () => {
      const active = document.activeElement;
      const focusWasHere = !active || active === document.body || element?.contains(active);
      if (focusWasHere && trigger?.isConnected) trigger.focus();
    };
  }, [returnFocusRef]);

  return (
    <div
      ref={panel}
      role="group"
      aria-labelledby={titleId}
      tabIndex={-1}
      onKeyDown={(event) => {
        if (event.key === "Escape" && !pending) onCancel();
      }}
      className={cn(
        "rounded-lg border-2 border-verdict-not-ready/60 bg-verdict-not-ready/5 p-4",
        className,
      )}
    >
      <p id={titleId} className="font-semibold text-ink">
        {title}
      </p>
      {children ? <div className="mt-2 flex flex-col gap-3 text-ink">{children}</div> : null}
      <div className="mt-4 flex flex-wrap gap-3">
        <Button
          variant="danger"
          disabled={pending}
          aria-busy={pending || undefined}
          onClick={onConfirm}
        >
          {pending ? <SpinnerGlyph className="size-5" /> : null}
          {confirmLabel}
        </Button>
        <Button variant="secondary" disabled={pending} onClick={onCancel}>
          {cancelLabel}
        </Button>
      </div>
    </div>
  );
}
