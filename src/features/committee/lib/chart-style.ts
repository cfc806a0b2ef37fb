import type { Severity } from "@shared/calc/verdict";
import type { AgeBucket } from "@shared/schemas/committee";

import { chartPalette, severityPalette } from "@/components/ui/palette";

/** The design tokens the charts draw with (SVG attributes cannot take Tailwind classes). */
export const chartColours = {
  brand: chartPalette.value,
  clay: chartPalette.flagged,
  ink: chartPalette.ink,
  inkMuted: chartPalette.reference,
  grid: chartPalette.grid,
} as const;

/** Lighter to darker with age; the oldest in the warm accent so it stands out. */
export const ageBucketColours: Record<AgeBucket, string> = {
  "0-7": "#a7d0d1",
  "8-30": "#3f8d90",
  "31-90": "#163b3d",
  "90+": "#9a4f22",
};

export const severityColours: Record<Severity, string> = severityPalette;

export const axisTick = { fill: chartColours.inkMuted, fontSize: 12 } as const;

export const tableStyles = {
  frame:
    // relative: the words kept for screen readers inside cells are positioned, and would otherwise
    // escape the scrolling frame and widen the whole page on a phone.
    "relative overflow-x-auto rounded-card border border-surface-line bg-surface print:overflow-visible",
  table: "committee-table w-full border-collapse text-left text-sm",
  caption: "px-2.5 pt-3 pb-1 text-left font-semibold text-ink",
  head: "border-b-2 border-surface-line px-2.5 py-2 align-bottom font-semibold text-ink-muted",
  cell: "border-b border-surface-line px-2.5 py-2 align-top",
  number: "border-b border-surface-line px-2.5 py-2 text-right align-top tabular-nums",
} as const;
