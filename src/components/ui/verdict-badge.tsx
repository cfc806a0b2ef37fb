import { type Verdict, verdictLabels } from "@shared/calc/verdict";

import { cn } from "@/lib/cn";

const tones: Record<Verdict, string> = {
  all_clear: "border-verdict-ready/40 bg-verdict-ready/10 text-verdict-ready",
  gaps_to_fix: "border-verdict-conditions/40 bg-verdict-conditions/10 text-verdict-conditions",
  hold: "border-verdict-not-ready/40 bg-verdict-not-ready/10 text-verdict-not-ready",
};

const solid: Record<Verdict, string> = {
  all_clear: "bg-verdict-ready text-white",
  gaps_to_fix: "bg-verdict-conditions text-white",
  hold: "bg-verdict-not-ready text-white",
};

/**
 * One shape per verdict, so it reads without colour: a tick in a circle (ready), a tick with a
 * bar beneath (ready with conditions), a cross in an octagon (not ready).
 */
export function VerdictIcon({ verdict, className }: { verdict: Verdict; className?: string }) {
  return (
    <svg
      aria-hidden="true"
      viewBox="0 0 20 20"
      fill="none"
      stroke="currentColor"
      strokeWidth="1.9"
      strokeLinecap="round"
      strokeLinejoin="round"
      className={cn("size-4 shrink-0", className)}
    >
      {verdict === "all_clear" ? (
        <>
          <circle cx="10" cy="10" r="8" />
          <path d="m6.3 10.2 2.5 2.5 4.9-5.2" />
        </>
      ) : verdict === "gaps_to_fix" ? (
        <>
          <circle cx="10" cy="8.5" r="6.5" />
          <path d="m7.2 8.6 2 2 3.7-4" />
          <path d="M5 18.3h10" />
        </>
      ) : (
        <>
          <path d="M6.7 2h6.6L18 6.7v6.6L13.3 18H6.7L2 13.3V6.7Z" />
          <path d="m7.3 7.3 5.4 5.4m0-5.4-5.4 5.4" />
        </>
      )}
    </svg>
  );
}

export interface VerdictBadgeProps {
  verdict: Verdict;
  className?: string;
}

/** A verdict as a small labelled chip: word, icon and colour together. */
export function VerdictBadge({ verdict, className }: VerdictBadgeProps) {
  return (
    <span
      className={cn(
        "inline-flex items-center gap-1.5 rounded-full border px-2.5 py-0.5 text-sm font-semibold whitespace-nowrap",
        tones[verdict],
        className,
      )}
    >
      <VerdictIcon verdict={verdict} />
      {verdictLabels[verdict]}
    </span>
  );
}

/** The verdict large, for the end of an audit. */
export function VerdictBanner({
  verdict,
  headingLevel = 2,
  className,
}: {
  verdict: Verdict;
  headingLevel?: 2 | 3;
  className?: string;
}) {
  const Heading = headingLevel === 2 ? "h2" : "h3";
  return (
    <div
      className={cn("flex items-center gap-3 rounded-card px-5 py-4", solid[verdict], className)}
    >
      <VerdictIcon verdict={verdict} className="size-10" />
      <Heading className="text-3xl font-bold tracking-tight">{verdictLabels[verdict]}</Heading>
    </div>
  );
}
