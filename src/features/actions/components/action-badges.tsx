import type { Severity } from "@shared/calc/verdict";
import { type ActionState, actionStateLabels } from "@shared/schemas/actions";

import { Badge, type BadgeTone } from "@/components/ui/badge";
import { cn } from "@/lib/cn";

import { severityLabels } from "../lib/action-labels";
import { awaitingGlyph, overdueGlyph, severityColours, severityGlyphs } from "../lib/action-pins";

function Glyph({
  glyph,
  className,
  colour,
}: {
  glyph: string;
  className?: string;
  colour?: string;
}) {
  return (
    <svg
      aria-hidden="true"
      focusable="false"
      viewBox="0 0 24 24"
      className={cn("size-4 shrink-0", className)}
      style={colour ? { color: colour } : undefined}
      // Fixed markup from our own symbol table, shared with the map pins.
      dangerouslySetInnerHTML={{ __html: glyph }}
    />
  );
}

export function SeveritySymbol({
  severity,
  className,
}: {
  severity: Severity;
  className?: string;
}) {
  return (
    <Glyph
      glyph={severityGlyphs[severity]}
      colour={severityColours[severity]}
      className={className}
    />
  );
}

export function OverdueSymbol({ className }: { className?: string }) {
  return <Glyph glyph={overdueGlyph} colour="#a3212b" className={className} />;
}

export function AwaitingSymbol({ className }: { className?: string }) {
  return <Glyph glyph={awaitingGlyph} colour="#1f6b3a" className={className} />;
}

const severityTones: Record<Severity, string> = {
  critical: "border-verdict-not-ready/40 bg-verdict-not-ready/10 text-verdict-not-ready",
  major: "border-verdict-conditions/40 bg-verdict-conditions/10 text-verdict-conditions",
  minor: "border-brand-200 bg-brand-50 text-brand-800",
};

/** Severity as shape and word together, so it reads without colour. */
export function SeverityBadge({ severity, className }: { severity: Severity; className?: string }) {
  return (
    <span
      className={cn(
        "inline-flex items-center gap-1.5 rounded-full border px-2.5 py-0.5 text-sm font-semibold whitespace-nowrap",
        severityTones[severity],
        className,
      )}
    >
      <SeveritySymbol severity={severity} />
      {severityLabels[severity]}
    </span>
  );
}

const statusTones: Record<ActionState, BadgeTone> = {
  to_fix: "neutral",
  fixing: "pending",
  to_check: "neutral",
  done: "positive",
};

export function StatusBadge({ status, className }: { status: ActionState; className?: string }) {
  return (
    <Badge tone={statusTones[status]} className={cn("gap-1.5", className)}>
      {status === "to_check" ? <AwaitingSymbol /> : null}
      {actionStateLabels[status]}
    </Badge>
  );
}

export function OverdueMark({ className }: { className?: string }) {
  return (
    <span
      className={cn(
        "inline-flex items-center gap-1.5 rounded-full border border-verdict-not-ready bg-verdict-not-ready px-2.5 py-0.5 text-sm font-semibold whitespace-nowrap text-white",
        className,
      )}
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
