import type { Severity } from "@shared/calc/verdict";
import { type ActionState, actionStateLabels } from "@shared/workflow/action-workflow";

import { type MarkerName, markerMarkup } from "@/components/ui/markers";
import { Mark } from "@/components/ui/marks";
import { cn } from "@/lib/cn";

import { severityLabels } from "../lib/action-labels";

function Marker({ name, className }: { name: MarkerName; className?: string }) {
  return (
    <svg
      aria-hidden="true"
      focusable="false"
      viewBox="0 0 24 24"
      className={cn("size-4 shrink-0", className)}
      // Fixed markup from the one marker vocabulary, shared with the map pins.
      dangerouslySetInnerHTML={{ __html: markerMarkup(name) }}
    />
  );
}

/** A severity's own shape from the marker vocabulary: diamond, square or hexagon. */
export function SeveritySymbol({
  severity,
  className,
}: {
  severity: Severity;
  className?: string;
}) {
  return <Marker name={severity} className={className} />;
}

export function OverdueSymbol({ className }: { className?: string }) {
  return <Marker name="overdue" className={className} />;
}

/** The "Fix to check" mark: proof is waiting for an auditor to look. */
export function AwaitingSymbol({ className }: { className?: string }) {
  return <Mark meaning="to_check" className={className} />;
}

const severityTones: Record<Severity, string> = {
  critical: "border-severity-critical/40 bg-severity-critical/10 text-severity-critical",
  major: "border-severity-major/40 bg-severity-major/10 text-severity-major",
  minor: "border-severity-minor/40 bg-severity-minor/10 text-severity-minor",
};

const chip =
  "inline-flex items-center gap-1.5 rounded-full border px-2.5 py-0.5 text-sm font-semibold whitespace-nowrap";

/** Severity as shape and word together, so it reads without colour. */
export function SeverityBadge({ severity, className }: { severity: Severity; className?: string }) {
  return (
    <span className={cn(chip, severityTones[severity], className)}>
      <SeveritySymbol severity={severity} />
      {severityLabels[severity]}
    </span>
  );
}

const stateTones: Record<ActionState, string> = {
  to_fix: "border-action-to-fix/40 bg-action-to-fix/10 text-action-to-fix",
  fixing: "border-action-fixing/40 bg-action-fixing/10 text-action-fixing",
  to_check: "border-action-to-check/40 bg-action-to-check/10 text-action-to-check",
  done: "border-action-done/40 bg-action-done/10 text-action-done",
};

/** Where an action stands: its doorway mark (see `marks.tsx`) and its words. */
export function StateBadge({ state, className }: { state: ActionState; className?: string }) {
  return (
    <span className={cn(chip, stateTones[state], className)} data-state={state}>
      <Mark meaning={state} />
      {actionStateLabels[state]}
    </span>
  );
}

export function OverdueMark({ className }: { className?: string }) {
  return (
    <span
      className={cn(chip, "border-severity-critical bg-severity-critical text-white", className)}
    >
      <svg aria-hidden="true" viewBox="0 0 24 24" className="size-4 shrink-0">
        <circle cx="12" cy="12" r="8.5" fill="none" stroke="currentColor" strokeWidth="2.4" />
        <path
          d="M12 7.5V12l3 2"
          fill="none"
          stroke="currentColor"
          strokeWidth="2.4"
          strokeLinecap="round"
        />
      </svg>
      Overdue
    </span>
  );
}
