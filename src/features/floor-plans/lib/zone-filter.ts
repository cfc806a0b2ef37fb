import type { Fixture, Space } from "@shared/schemas/floors";
import { type ZoneType, zoneTypes } from "@shared/zones";

/** The zone types currently shown; everything starts visible. */
export type ZoneFilter = ReadonlySet<ZoneType>;

export function showAllZones(): ZoneFilter {
  return new Set(zoneTypes);
}

export function setZoneVisible(
  filter: ZoneFilter,
  zoneType: ZoneType,
  visible: boolean,
): ZoneFilter {
  const next = new Set(filter);
  if (visible) next.add(zoneType);
  else next.delete(zoneType);
  return next;
}

/** The spaces the filter shows, and only the fixtures standing in them. */
export function applyZoneFilter(
  content: { spaces: readonly Space[]; fixtures: readonly Fixture[] },
  filter: ZoneFilter,
): { spaces: Space[]; fixtures: Fixture[] } {
  const spaces = content.spaces.filter((space) => filter.has(space.zoneType));
  const shown = new Set(spaces.map((space) => space.id));
  return { spaces, fixtures: content.fixtures.filter((fixture) => shown.has(fixture.spaceId)) };
}
