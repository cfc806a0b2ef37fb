import { type Verdict, verdictLabels } from "@shared/calc/verdict";

import { cn } from "@/lib/cn";

import { Mark } from "./marks";

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
 * The verdict's doorway mark (see `marks.tsx`): a complete doorway, a doorway with a broken post,
 * a doorway barred. Decorative: always shown beside the verdict's words.
 */
export function VerdictIcon({
  verdict,
  className,
  inherit = false,
}: {
  verdict: Verdict;
  className?: string;
  inherit?: boolean;
}) {
  return <Mark meaning={verdict} className={className} inherit={inherit} />;
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
      <VerdictIcon verdict={verdict} className="size-10" inherit />
      <Heading className="text-3xl font-bold tracking-tight">{verdictLabels[verdict]}</Heading>
    </div>
  );
}
