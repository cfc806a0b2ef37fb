import type { Space, Suite } from "@shared/schemas/floors";

import { zoneOrder } from "./zone-styles";

export interface SuiteGroup {
  /** null for the spaces that belong to no suite. */
  suite: Suite | null;
  spaces: Space[];
}

const byName = (a: string, b: string) => a.localeCompare(b, undefined, { numeric: true });

function bySpaceOrder(a: Space, b: Space): number {
  return zoneOrder[a.zoneType] - zoneOrder[b.zoneType] || byName(a.name, b.name);
}

/**
 * Spaces grouped the way a suite is walked: room, anteroom, donning zone, doffing area. Suites by
 * name, then the spaces outside any suite; suites with no space left are not listed.
 */
export function groupSpacesBySuite(
  spaces: readonly Space[],
  suites: readonly Suite[],
): SuiteGroup[] {
  const groups: SuiteGroup[] = [...suites]
    .sort((a, b) => byName(a.name, b.name))
    .map((suite) => ({
      suite,
      spaces: spaces.filter((space) => space.suiteId === suite.id).sort(bySpaceOrder),
    }));
  const known = new Set(suites.map((suite) => suite.id));
  const loose = spaces
    .filter((space) => space.suiteId === null || !known.has(space.suiteId))
    .sort(bySpaceOrder);
  return [...groups, { suite: null, spaces: loose }].filter((group) => group.spaces.length > 0);
}

export function spaceTitle(space: Pick<Space, "name" | "number">): string {
  return space.number ? `${space.name} (No. ${space.number})` : space.name;
}
