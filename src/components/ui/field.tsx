import { type ReactNode, useId } from "react";

import { cn } from "@/lib/cn";

/** What a control needs to be tied to its label, hint and error. */
export interface FieldControlProps {
  id: string;
  "aria-invalid": true | undefined;
  "aria-describedby": string | undefined;
}

export interface FieldProps {
  label: ReactNode;
  /** Shown below the control and announced with it; marks the control invalid. */
  error?: string;
  /** A short help text, also tied to the control. */
  hint?: ReactNode;
  className?: string;
  children: (control: FieldControlProps) => ReactNode;
}

/** Label, hint and error around any form control, wired for screen readers. */
export function Field({ label, error, hint, className, children }: FieldProps) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const describedBy = [hint ? hintId : null, error ? errorId : null].filter(Boolean).join(" ");

  return (
    <div className={cn("flex flex-col gap-1.5", className)}>
      <label htmlFor={id} className="font-semibold text-ink">
        {label}
      </label>
      {hint ? (
        <p id={hintId} className="text-sm text-ink-muted">
          {hint}
        </p>
      ) : null}
      {children({
        id,
        "aria-invalid": error ? true : undefined,
        "aria-describedby": describedBy || undefined,
      })}
      {error ? <FieldError id={errorId}>{error}</FieldError> : null}
    </div>
  );
}

export function FieldError({ id, children }: { id?: string; children: ReactNode }) {
  return (
    <p id={id} className="flex items-start gap-1.5 text-sm font-semibold text-verdict-not-ready">
      <svg aria-hidden="true" viewBox="0 0 20 20" className="mt-0.5 size-4 shrink-0 fill-current">
        <path d="M10 2a8 8 0 1 0 0 16 8 8 0 0 0 0-16Zm-.9 4h1.8v5.2H9.1V6Zm.9 8.6a1.1 1.1 0 1 1 0-2.2 1.1 1.1 0 0 1 0 2.2Z" />
      </svg>
      {children}
    </p>
  );
}

/** The look shared by text inputs, selects and text areas. */
export function controlStyles(invalid: boolean, className?: string): string {
  return cn(
    "min-h-tap w-full rounded-lg border border-ink-subtle bg-surface px-3 py-2 text-base text-ink",
    "placeholder:text-ink-subtle",
    invalid && "border-verdict-not-ready",
    className,
  );
}
