import { type ComponentProps, useId } from "react";

import { cn } from "@/lib/cn";

export interface TextFieldProps extends Omit<ComponentProps<"input">, "id"> {
  label: string;
  /** Shown below the field and announced with it; marks the field invalid. */
  error?: string;
  /** A short help text, also tied to the field. */
  hint?: string;
}

export function TextField({ label, error, hint, className, ...inputProps }: TextFieldProps) {
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
      <input
        id={id}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy || undefined}
        className={cn(
          "min-h-tap w-full rounded-lg border border-ink-subtle bg-surface px-3 py-2 text-base text-ink",
          "placeholder:text-ink-subtle",
          error && "border-verdict-not-ready",
        )}
        {...inputProps}
      />
      {error ? (
        <p
          id={errorId}
          className="flex items-start gap-1.5 text-sm font-semibold text-verdict-not-ready"
        >
          <svg
            aria-hidden="true"
            viewBox="0 0 20 20"
            className="mt-0.5 size-4 shrink-0 fill-current"
          >
            <path d="M10 2a8 8 0 1 0 0 16 8 8 0 0 0 0-16Zm-.9 4h1.8v5.2H9.1V6Zm.9 8.6a1.1 1.1 0 1 1 0-2.2 1.1 1.1 0 0 1 0 2.2Z" />
          </svg>
          {error}
        </p>
      ) : null}
    </div>
  );
}
