import type { FixtureKind, ZoneType } from "@shared/zones";

import { cn } from "@/lib/cn";

import { fixtureGlyphs } from "../lib/fixture-symbols";
import { spacingWarningColour, zoneStyles } from "../lib/zone-styles";

export interface FixtureSymbolProps {
  kind: FixtureKind;
  className?: string;
}

/** A fixture's symbol as on the map, for the key and the list. */
export function FixtureSymbol({ kind, className }: FixtureSymbolProps) {
  return (
    <span
      aria-hidden="true"
      className={cn(
        "inline-flex size-7 shrink-0 items-center justify-center rounded-full border-2 border-brand-800 bg-surface text-brand-800",
        className,
      )}
    >
      <svg
        viewBox="0 0 24 24"
        fill="none"
        stroke="currentColor"
        strokeWidth="1.8"
        strokeLinecap="round"
        strokeLinejoin="round"
        className="size-[18px]"
        // Fixed markup from our own symbol table, shared with the map markers.
        dangerouslySetInnerHTML={{ __html: fixtureGlyphs[kind] }}
      />
    </span>
  );
}

/** A small sample of a zone's outline and fill, for the key, filters and list. */
export function ZoneSwatch({ zoneType, className }: { zoneType: ZoneType; className?: string }) {
  const style = zoneStyles[zoneType];
  return (
    <svg aria-hidden="true" viewBox="0 0 36 20" className={cn("h-5 w-9 shrink-0", className)}>
      <rect
        x="2"
        y="2"
        width="32"
        height="16"
        rx="2"
        fill={style.colour}
        fillOpacity="0.2"
        stroke={style.colour}
        strokeWidth="2.5"
        strokeDasharray={style.dashArray}
        strokeLinecap="round"
      />
    </svg>
  );
}

/** The red dashed line drawn between hand-rub stations that are too close. */
export function SpacingLineSwatch({ className }: { className?: string }) {
  return (
    <svg aria-hidden="true" viewBox="0 0 36 20" className={cn("h-5 w-9 shrink-0", className)}>
      <path
        d="M2 10h32"
        stroke={spacingWarningColour}
        strokeWidth="3"
        strokeDasharray="6 4"
        fill="none"
      />
    </svg>
  );
}
