import type { Proportion } from "@shared/schemas/committee";

import { intervalText, percentText } from "../lib/committee-format";

export interface ProportionFigureProps {
  proportion: Pick<Proportion, "n" | "rate" | "interval" | "smallSample">;
  /** Said when there was nothing to count, e.g. "No answers". */
  empty: string;
}

/** A rate with its 95% interval and how many it rests on, flagged when the sample is small. */
export function ProportionFigure({ proportion, empty }: ProportionFigureProps) {
  if (proportion.rate === null) return <span className="text-ink-muted">{empty}</span>;
  return (
    <>
      <span className="block font-semibold">{percentText(proportion.rate)}</span>
      <span className="block whitespace-nowrap text-ink-muted">
        {intervalText(proportion.interval)}
      </span>
      <span className="block text-ink-muted">
        {`n = ${proportion.n.toLocaleString()}`}
        {proportion.smallSample ? ", small sample" : ""}
      </span>
    </>
  );
}
