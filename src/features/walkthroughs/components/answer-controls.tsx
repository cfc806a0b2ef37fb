import { severityLabels, type Outcome, type Severity } from "@shared/calc/verdict";
import type { ReactNode } from "react";

import { cn } from "@/lib/cn";

export const outcomeLabels: Record<Outcome, string> = {
  pass: "Pass",
  fail: "Fail",
  not_applicable: "Not applicable",
};

/** How an answered item reads in lists and summaries. */
export const outcomeStates: Record<Outcome, string> = {
  pass: "Passed",
  fail: "Failed",
  not_applicable: "Not applicable",
};

export function OutcomeIcon({
  outcome,
  className,
}: {
  outcome: Outcome | null;
  className?: string;
}) {
  return (
    <svg
      aria-hidden="true"
      viewBox="0 0 20 20"
      fill="none"
      stroke="currentColor"
      strokeWidth="2"
      strokeLinecap="round"
      strokeLinejoin="round"
      className={cn("size-5 shrink-0", className)}
    >
      {outcome === "pass" ? (
        <path d="m4.5 10.5 3.5 3.5 7.5-8" />
      ) : outcome === "fail" ? (
        <path d="m5.5 5.5 9 9m0-9-9 9" />
      ) : outcome === "not_applicable" ? (
        <>
          <circle cx="10" cy="10" r="6.5" />
          <path d="m5.5 14.5 9-9" />
        </>
      ) : (
        <circle cx="10" cy="10" r="6.5" strokeDasharray="2.5 2.5" />
      )}
    </svg>
  );
}

const chosenStyles: Record<Outcome, string> = {
  pass: "border-verdict-ready bg-verdict-ready text-white",
  fail: "border-verdict-not-ready bg-verdict-not-ready text-white",
  not_applicable: "border-ink-muted bg-ink-muted text-white",
};

export interface OutcomeButtonsProps {
  options: readonly Outcome[];
  chosen: Outcome | null;
  onChoose: (outcome: Outcome) => void;
  disabled?: boolean;
}

/** Big, thumb-sized answer buttons; the chosen one is filled and marked pressed. */
export function OutcomeButtons({
  options,
  chosen,
  onChoose,
  disabled = false,
}: OutcomeButtonsProps) {
  return (
    <div
      className={cn(
        "grid gap-2",
        options.length === 3 ? "grid-cols-3" : options.length === 2 ? "grid-cols-2" : "grid-cols-1",
      )}
    >
      {options.map((outcome) => {
        const selected = chosen === outcome;
        return (
          <button
            key={outcome}
            type="button"
            aria-pressed={selected}
            disabled={disabled}
            onClick={() => onChoose(outcome)}
            className={cn(
              "flex min-h-16 flex-col items-center justify-center gap-1 rounded-lg border-2 px-2 py-2 text-center text-base leading-tight font-semibold transition-colors",
              "disabled:cursor-not-allowed disabled:opacity-60",
              selected
                ? chosenStyles[outcome]
                : "border-surface-line bg-surface text-ink hover:border-brand-300 hover:bg-brand-50",
            )}
          >
            <OutcomeIcon outcome={outcome} />
            {outcomeLabels[outcome]}
          </button>
        );
      })}
    </div>
  );
}

export interface ChoiceButtonsProps {
  choices: readonly { value: string; label: string }[];
  chosen: string | null;
  onChoose: (value: string) => void;
  disabled?: boolean;
}

export function ChoiceButtons({ choices, chosen, onChoose, disabled = false }: ChoiceButtonsProps) {
  return (
    <div className="grid gap-2 sm:grid-cols-2">
      {choices.map((choice) => {
        const selected = chosen === choice.value;
        return (
          <button
            key={choice.value}
            type="button"
            aria-pressed={selected}
            disabled={disabled}
            onClick={() => onChoose(choice.value)}
            className={cn(
              "flex min-h-14 items-center gap-3 rounded-lg border-2 px-4 py-2 text-left text-base font-semibold transition-colors",
              "disabled:cursor-not-allowed disabled:opacity-60",
              selected
                ? "border-brand-700 bg-brand-700 text-white"
                : "border-surface-line bg-surface text-ink hover:border-brand-300 hover:bg-brand-50",
            )}
          >
            <span
              aria-hidden="true"
              className={cn(
                "grid size-5 shrink-0 place-items-center rounded-full border-2",
                selected ? "border-white" : "border-ink-subtle",
              )}
            >
              {selected ? <span className="size-2.5 rounded-full bg-white" /> : null}
            </span>
            {choice.label}
          </button>
        );
      })}
    </div>
  );
}

const severityStyles: Record<Severity, string> = {
  critical: "border-verdict-not-ready/50 bg-verdict-not-ready/10 text-verdict-not-ready",
  major: "border-verdict-conditions/50 bg-verdict-conditions/10 text-verdict-conditions",
  minor: "border-surface-line bg-surface-sunken text-ink-muted",
};

/** Severity in words with a weight mark (three bars, two, one) so it reads without colour. */
export function SeverityBadge({ severity }: { severity: Severity }) {
  const bars = severity === "critical" ? 3 : severity === "major" ? 2 : 1;
  return (
    <span
      className={cn(
        "inline-flex items-center gap-1.5 rounded-full border px-2.5 py-0.5 text-sm font-semibold",
        severityStyles[severity],
      )}
    >
      <svg aria-hidden="true" viewBox="0 0 14 12" className="h-3 w-3.5 fill-current">
        {[0, 1, 2].map((bar) => (
          <rect
            key={bar}
            x={bar * 5}
            y={8 - bar * 4}
            width="3.5"
            height={4 + bar * 4}
            rx="0.8"
            opacity={bar < bars ? 1 : 0.25}
          />
        ))}
      </svg>
      {severityLabels[severity]}
    </span>
  );
}

/** A line that says whether a value meets its limit, with a mark as well as a colour. */
export function JudgementLine({
  outcome,
  children,
}: {
  outcome: "pass" | "fail" | null;
  children: ReactNode;
}) {
  return (
    <p
      className={cn(
        "flex items-start gap-2 text-sm font-semibold",
        outcome === "pass"
          ? "text-verdict-ready"
          : outcome === "fail"
            ? "text-verdict-not-ready"
            : "text-ink-muted",
      )}
    >
      <OutcomeIcon outcome={outcome} className="mt-px" />
      <span>{children}</span>
    </p>
  );
}
