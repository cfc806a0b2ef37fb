import type { ReactElement, ReactNode } from "react";
import { ResponsiveContainer } from "recharts";

import { cn } from "@/lib/cn";

export interface LegendEntry {
  label: string;
  /** A small SVG drawn in the same shape and colour as the chart's mark. */
  mark: ReactNode;
}

export interface ChartFigureProps {
  /** What the chart shows, read by screen readers instead of the drawing. */
  summary: string;
  height: number;
  chart: ReactElement;
  legend?: readonly LegendEntry[];
  /** The same numbers as a table, always shown beside the chart. */
  table: ReactNode;
  /** Chart and table side by side on wide screens; for narrow tables. Otherwise stacked. */
  sideBySide?: boolean;
  className?: string;
}

/**
 * A chart with its numbers. The drawing is one image to assistive technology, described by the
 * summary; the table next to it carries every value, so nothing depends on seeing the chart.
 */
export function ChartFigure({
  summary,
  height,
  chart,
  legend,
  table,
  sideBySide = false,
  className,
}: ChartFigureProps) {
  return (
    <div
      className={cn(
        "grid gap-4",
        sideBySide && "xl:grid-cols-2 xl:items-start print:grid-cols-1",
        className,
      )}
    >
      <figure className="committee-chart min-w-0 rounded-card border border-surface-line bg-surface p-3">
        <div role="img" aria-label={summary} style={{ height }} className="w-full">
          <ResponsiveContainer
            width="100%"
            height={height}
            initialDimension={{ width: 640, height }}
          >
            {chart}
          </ResponsiveContainer>
        </div>
        {legend && legend.length > 0 ? (
          <figcaption>
            <ul className="mt-2 flex flex-wrap gap-x-4 gap-y-1 text-sm text-ink-muted">
              {legend.map((entry) => (
                <li key={entry.label} className="flex items-center gap-1.5">
                  <svg aria-hidden="true" viewBox="0 0 16 16" className="size-4 shrink-0">
                    {entry.mark}
                  </svg>
                  {entry.label}
                </li>
              ))}
            </ul>
          </figcaption>
        ) : null}
      </figure>
      <div className="min-w-0">{table}</div>
    </div>
  );
}
