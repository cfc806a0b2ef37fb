import {
  fixtureKindLabels,
  fixtureKinds,
  type ZoneType,
  zoneTypeLabels,
  zoneTypes,
} from "@shared/zones";

import { Card } from "@/components/ui/card";

import type { ZoneFilter } from "../lib/zone-filter";
import { FixtureSymbol, SpacingLineSwatch, ZoneSwatch } from "./symbols";

export interface MapKeyProps {
  filter: ZoneFilter;
  onZoneVisibleChange: (zoneType: ZoneType, visible: boolean) => void;
}

/** The map's key, with the zone types doubling as filters. */
export function MapKey({ filter, onZoneVisibleChange }: MapKeyProps) {
  return (
    <Card>
      <h2 className="text-lg font-semibold">Key</h2>
      <fieldset className="mt-3">
        <legend className="text-sm font-semibold text-ink-muted">Zone types on the map</legend>
        <ul className="mt-1">
          {zoneTypes.map((zoneType) => (
            <li key={zoneType}>
              <label className="flex min-h-tap cursor-pointer items-center gap-3">
                <input
                  type="checkbox"
                  className="size-5 accent-brand-700"
                  checked={filter.has(zoneType)}
                  onChange={(event) => onZoneVisibleChange(zoneType, event.target.checked)}
                />
                <ZoneSwatch zoneType={zoneType} />
                <span>{zoneTypeLabels[zoneType]}</span>
              </label>
            </li>
          ))}
        </ul>
      </fieldset>
      <h3 className="mt-4 text-sm font-semibold text-ink-muted">Fixtures</h3>
      <ul className="mt-2 grid grid-cols-1 gap-2 min-[420px]:grid-cols-2 lg:grid-cols-1">
        {fixtureKinds.map((kind) => (
          <li key={kind} className="flex items-center gap-2 text-sm">
            <FixtureSymbol kind={kind} />
            {fixtureKindLabels[kind]}
          </li>
        ))}
      </ul>
      <p className="mt-3 flex items-center gap-2 text-sm">
        <SpacingLineSwatch />
        Hand-rub stations too close together
      </p>
    </Card>
  );
}
