import type { ComparisonResponse } from "@shared/schemas/committee";

import { cn } from "@/lib/cn";

import { percentText, pointsText } from "../lib/committee-format";

export interface DifferencePanelProps {
  comparison: ComparisonResponse;
  siteA: string | undefined;
  siteB: string | undefined;
}

export const differenceVerdicts = {
  excludesZero: "The interval leaves out zero: the difference is unlikely to be chance.",
  includesZero: "The interval includes zero: the difference may be chance.",
} as const;

/** The chosen pair's difference in readiness, its interval, and what that means in words. */
export function DifferencePanel({ comparison, siteA, siteB }: DifferencePanelProps) {
  const a = comparison.sites.find((site) => site.siteId === siteA);
  const b = comparison.sites.find((site) => site.siteId === siteB);
  const difference = comparison.difference;

  let body;
  if (!a || !b) {
    body = <p className="text-ink-muted">Choose two sites above to compare them.</p>;
  } else if (a.siteId === b.siteId) {
    body = <p className="text-ink-muted">Choose two different sites to compare.</p>;
  } else if (!difference || difference.siteA !== a.siteId || difference.siteB !== b.siteId) {
    const empty = [a, b].filter((site) => site.readiness.n === 0).map((site) => site.siteName);
    body = (
      <p className="text-ink-muted">
        {empty.length > 0
          ? `${empty.join(" and ")} ${empty.length === 1 ? "has" : "have"} no audits in this period, so there is no difference to measure.`
          : "Working out the difference…"}
      </p>
    );
  } else {
    const higher = difference.difference > 0 ? a : b;
    const lower = higher === a ? b : a;
    body = (
      <>
        <p className="text-lg">
          <span className="font-semibold">{`${a.siteName} minus ${b.siteName}: `}</span>
          {`${pointsText(difference.difference)} percentage points`}
          <span className="text-ink-muted">{` (${percentText(a.readiness.rate)} against ${percentText(b.readiness.rate)})`}</span>
        </p>
        <p>
          {`95% interval of the difference: ${pointsText(difference.interval.lower)} to ${pointsText(difference.interval.upper)} points.`}
        </p>
        <p
          className={cn(
            "rounded-lg border-l-4 px-3 py-2 font-semibold",
            difference.excludesZero
              ? "border-clay-600 bg-clay-50 text-clay-700"
              : "border-brand-600 bg-brand-50 text-brand-800",
          )}
        >
          {difference.excludesZero
            ? differenceVerdicts.excludesZero
            : differenceVerdicts.includesZero}
        </p>
        <p className="text-sm text-ink-muted">
          {difference.excludesZero
            ? `${higher.siteName} was ready more often than ${lower.siteName} in this period, by more than the number of audits alone would explain.`
            : "With this many audits, a gap of this size could appear between two sites that are in fact equally ready."}
        </p>
      </>
    );
  }

  return (
    <section
      aria-labelledby="committee-difference"
      className="flex flex-col gap-2 rounded-card border border-surface-line bg-surface p-4 md:p-5"
    >
      <h2 id="committee-difference" className="text-xl font-bold tracking-tight">
        Difference between two sites
      </h2>
      <div aria-live="polite" className="flex flex-col gap-2">
        {body}
      </div>
    </section>
  );
}
