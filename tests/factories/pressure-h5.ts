import { randomUUID } from "node:crypto";

import type { Database } from "../../server/db/client";
import { pressureAlarms, pressureMonitors } from "../../server/db/schema/index";

/** A monitor mapped to a room (its id as the building names it is made unique). */
export async function insertMonitorH5(
  db: Database,
  space: { id: string; siteId: string },
  monitorId = `mon-h5-${randomUUID().slice(0, 8)}`,
) {
  const [row] = await db
    .insert(pressureMonitors)
    .values({ monitorId, siteId: space.siteId, spaceId: space.id })
    .returning();
  return row!;
}

/**
 * An alarm row as the alarm job writes it: an out-of-range excursion (or a silent monitor) from
 * `startedAt` (its first reading out of range) to `endedAt` (null while it runs). The alarm time is
 * a minute after the start, the site's default grace.
 */
export async function insertAlarmH5(
  db: Database,
  monitor: { id: string; monitorId: string; siteId: string; spaceId: string },
  input: {
    startedAt: Date;
    endedAt: Date | null;
    kind?: "out_of_range" | "no_readings";
    worstPa?: number;
  },
) {
  const kind = input.kind ?? "out_of_range";
  const worstPa = input.worstPa ?? 1.5;
  const [row] = await db
    .insert(pressureAlarms)
    .values({
      monitorRowId: monitor.id,
      monitorId: monitor.monitorId,
      siteId: monitor.siteId,
      spaceId: monitor.spaceId,
      kind,
      startedAt: input.startedAt,
      alarmAt: new Date(input.startedAt.getTime() + 60_000),
      endedAt: input.endedAt,
      ...(kind === "out_of_range"
        ? { worstValue: worstPa, worstUnit: "Pa" as const, worstPa, worstAt: input.startedAt }
        : {}),
    })
    .returning();
  return row!;
}
