import type { Verdict } from "@shared/calc/verdict";
import type { ActionState } from "@shared/workflow/action-workflow";

import { cn } from "@/lib/cn";

import {
  type ActionStateMeaning,
  actionStatePalette,
  type VerdictMeaning,
  verdictPalette,
} from "./palette";

export type { ActionStateMeaning, VerdictMeaning } from "./palette";

/**
 * Lintel's marks, drawn from the brand's doorway: a lintel over two posts. A verdict says whether
 * the way through is sound; an action's state says how far the repair has come. Each mark has a
 * shape of its own (readable without colour) and is always shown with its words.
 */
export type MarkMeaning = VerdictMeaning | ActionStateMeaning;

// The palette is keyed by the stored codes themselves; these fail to compile if they drift apart.
type Same<A, B> = [A] extends [B] ? ([B] extends [A] ? true : never) : never;
const verdictsMatch: Same<VerdictMeaning, Verdict> = true;
const statesMatch: Same<ActionStateMeaning, ActionState> = true;
void verdictsMatch;
void statesMatch;

export const markColours: Record<MarkMeaning, string> = {
  ...verdictPalette,
  ...actionStatePalette,
};

const box = (x: number, y: number, w: number, h: number) => `M${x} ${y}h${w}v${h}h${-w}Z`;

// The doorway on a 20-unit square: posts 3 wide, an opening 8 wide between them.
const lintel = box(1.5, 2.5, 17, 3.5);
const leftPost = box(3, 6, 3, 12);
const rightPost = box(14, 6, 3, 12);

interface MarkShape {
  /** Filled parts. */
  fill: string[];
  /** Outlined parts, drawn with a 1.6-unit line. */
  line?: string[];
  /** What the shape shows, for the guide and the tests. */
  drawing: string;
}

export const markShapes: Record<MarkMeaning, MarkShape> = {
  all_clear: {
    fill: [lintel, leftPost, rightPost],
    drawing: "a complete doorway, the way through open",
  },
  gaps_to_fix: {
    fill: [lintel, leftPost, box(14, 6, 3, 4), box(14.8, 13, 3, 5)],
    drawing: "a doorway with a broken post",
  },
  hold: {
    fill: [lintel, leftPost, rightPost, box(0.5, 10, 19, 3.5)],
    drawing: "a doorway with a bar across the opening",
  },
  to_fix: {
    fill: [lintel, leftPost],
    line: [box(14.8, 6.8, 1.4, 10.4)],
    drawing: "a doorway missing a post, its place marked out",
  },
  fixing: {
    fill: ["M1.5 9.5 18.5 4.5V1 1.5 6Z", box(3, 9.5, 3, 8.5), box(14, 9.5, 3, 8.5)],
    drawing: "a lintel being lifted onto its posts",
  },
  to_check: {
    fill: [lintel, leftPost, rightPost],
    line: ["M7.4 11.2a2.6 2.6 0 1 0 5.2 0a2.6 2.6 0 1 0 -5.2 0Z", "M11.9 13.2 13.2 15.4"],
    drawing: "a complete doorway with a lens in the opening",
  },
  done: {
    fill: [lintel, box(3, 6, 3, 10), box(14, 6, 3, 10), box(1.5, 16, 17, 2.5)],
    drawing: "a doorway with its sill: a closed frame",
  },
};

function shapeMarkup(meaning: MarkMeaning): string {
  const shape = markShapes[meaning];
  return [
    ...shape.fill.map((d) => `<path d="${d}" fill="currentColor"/>`),
    ...(shape.line ?? []).map(
      (d) =>
        `<path d="${d}" fill="none" stroke="currentColor" stroke-width="1.6" stroke-linecap="round"/>`,
    ),
  ].join("");
}

/** The mark as standalone SVG markup, for places built as HTML (map pins). */
export function markSvg(meaning: MarkMeaning, className = ""): string {
  return `<svg viewBox="0 0 20 20" class="${className}" aria-hidden="true" focusable="false" data-mark="${meaning}" style="color:${markColours[meaning]}">${shapeMarkup(meaning)}</svg>`;
}

export interface MarkProps {
  meaning: MarkMeaning;
  className?: string;
  /** Draw in the surrounding text colour instead of the mark's own (e.g. white on a banner). */
  inherit?: boolean;
}

/** One mark, decorative: the words beside it carry the meaning. */
export function Mark({ meaning, className, inherit = false }: MarkProps) {
  const shape = markShapes[meaning];
  return (
    <svg
      aria-hidden="true"
      focusable="false"
      viewBox="0 0 20 20"
      data-mark={meaning}
      className={cn("size-4 shrink-0", className)}
      style={inherit ? undefined : { color: markColours[meaning] }}
    >
      {shape.fill.map((d) => (
        <path key={d} d={d} fill="currentColor" />
      ))}
      {(shape.line ?? []).map((d) => (
        <path
          key={d}
          d={d}
          fill="none"
          stroke="currentColor"
          strokeWidth="1.6"
          strokeLinecap="round"
        />
      ))}
    </svg>
  );
}
