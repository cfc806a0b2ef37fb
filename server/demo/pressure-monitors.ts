import { and, asc, eq, isNull } from "drizzle-orm";

import type { Tx } from "../db/client";
import { pressureMonitors, spaces } from "../db/schema/index";
import type { DemoSiteKey } from "./people";

/** The demo monitor whose room's door opens now and then and which drifts positive once an hour. */
export const demoDriftingMonitorId = "wexley-room-1";

/**
 * Maps every demo isolation room to a monitor named after its site and room number
 * (`wexley-room-1`), as a building's gateway would name them; the local simulator publishes
 * readings for each.
 */
export async function createDemoPressureMonitors(
  tx: Tx,
  siteIds: Record<DemoSiteKey, string>,
): Promise<void> {
  for (const [key, siteId] of Object.entries(siteIds) as [DemoSiteKey, string][]) {
    const rooms = await tx
      .select({ id: spaces.id, name: spaces.name })
      .from(spaces)
      .where(
        and(
          eq(spaces.siteId, siteId),
          eq(spaces.zoneType, "isolation_room"),
          isNull(spaces.retiredAt),
        ),
      )
      .orderBy(asc(spaces.name));
    for (const room of rooms) {
      const number = /(\d+)\s*$/.exec(room.name)?.[1];
      if (!number) continue;
      await tx
        .insert(pressureMonitors)
        .values({ monitorId: `${key}-room-${number}`, siteId, spaceId: room.id })
        .onConflictDoNothing();
    }
  }
}
