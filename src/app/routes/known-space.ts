import type { ZoneType } from "@shared/zones";
import type { QueryClient } from "@tanstack/react-query";

import { cachedSpace } from "@/features/floor-plans/api/get-floor";
import { scheduledSpace } from "@/features/walkthroughs/api/get-site-schedule";

/** A space's name and zone type from whatever the phone has loaded or kept: a floor or a due list. */
export function knownSpace(
  queryClient: QueryClient,
  spaceId: string,
): { name: string; zoneType: ZoneType } | null {
  const onFloor = cachedSpace(queryClient, spaceId);
  if (onFloor) return { name: onFloor.space.name, zoneType: onFloor.space.zoneType };
  const due = scheduledSpace(queryClient, spaceId);
  return due ? { name: due.spaceName, zoneType: due.zoneType } : null;
}
