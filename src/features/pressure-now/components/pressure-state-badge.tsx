import type { PressureRoomState } from "@shared/schemas/pressure-site";

import { cn } from "@/lib/cn";

const looks: Record<PressureRoomState, string> = {
  excursion: "border-verdict-not-ready bg-verdict-not-ready/10 text-verdict-not-ready",
  no_readings: "border-verdict-conditions bg-verdict-conditions/10 text-verdict-conditions",
  out_of_range: "border-verdict-conditions/40 bg-surface text-verdict-conditions",
  in_range: "border-verdict-ready/40 bg-verdict-ready/10 text-verdict-ready",
  never_reported: "border-surface-line bg-surface-sunken text-ink-muted",
};

const words: Record<PressureRoomState, string> = {
  excursion: "Not negative now",
  no_readings: "No pressure readings",
  out_of_range: "Out of range, within grace",
  in_range: "Negative now",
  never_reported: "Monitor never reported",
};

/** A room's live pressure state in words, with a glyph of its own for the two that need someone. */
export function PressureStateBadge({
  state,
  className,
}: {
  state: PressureRoomState;
  className?: string;
}) {
  return (
    <span
      data-pressure-state={state}
      className={cn(
        "inline-flex items-center gap-1 rounded-full border px-2.5 py-0.5 text-sm font-semibold whitespace-nowrap",
        state === "excursion" || state === "no_readings" ? "border-2" : "",
        looks[state],
        className,
      )}
    >
      {state === "excursion" ? <span aria-hidden="true">!</span> : null}
      {state === "no_readings" ? <span aria-hidden="true">?</span> : null}
      {words[state]}
    </span>
  );
}
