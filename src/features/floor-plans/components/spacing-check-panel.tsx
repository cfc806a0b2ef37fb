import type { Fixture } from "@shared/schemas/floors";
import { fixtureKindLabels } from "@shared/zones";
import { useId } from "react";

import { cn } from "@/lib/cn";

import type { SpacingCheck } from "../lib/spacing-check";

export interface SpacingCheckPanelProps {
  check: SpacingCheck;
  spaceNames: ReadonlyMap<string, string>;
}

function describeStation(station: Fixture, spaceNames: ReadonlyMap<string, string>): string {
  const name = station.label ?? fixtureKindLabels[station.kind];
  const space = spaceNames.get(station.spaceId);
  return space ? `${name} in ${space}` : name;
}

const tones = {
  flagged: "border-verdict-not-ready bg-verdict-not-ready/10",
  clear: "border-verdict-ready bg-verdict-ready/10",
  unknown: "border-verdict-conditions bg-verdict-conditions/10",
};

/** The hand-rub spacing rule for the whole floor, beside the red lines drawn on the map. */
export function SpacingCheckPanel({ check, spaceNames }: SpacingCheckPanelProps) {
  const headingId = useId();
  const pairs = check.kind === "checked" ? check.pairs : [];
  const tone = check.kind === "no-scale" ? "unknown" : pairs.length > 0 ? "flagged" : "clear";

  return (
    <section
      aria-labelledby={headingId}
      className={cn("rounded-lg border-l-4 px-4 py-3 text-sm leading-relaxed", tones[tone])}
    >
      <div role="status">
        <h2 id={headingId} className="text-base font-semibold text-ink">
          Spacing check
        </h2>
        <p className="mt-1 text-ink">{check.message}</p>
        {pairs.length > 0 ? (
          <ul className="mt-2 flex flex-col gap-2">
            {pairs.map((pair) => (
              <li key={`${pair.a.id}-${pair.b.id}`} className="rounded-md bg-surface px-3 py-2">
                <p className="font-semibold text-verdict-not-ready">{pair.message}</p>
                <p className="text-ink-muted">
                  {describeStation(pair.a, spaceNames)} and {describeStation(pair.b, spaceNames)}
                </p>
              </li>
            ))}
          </ul>
        ) : null}
      </div>
    </section>
  );
}
