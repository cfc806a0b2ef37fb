import type { PressureReading } from "@shared/schemas/pressure-readings";
import type { ZoneType } from "@shared/zones";

import type { Database } from "../../server/db/client";
import { pressureMonitors, pressureSiteSettings } from "../../server/db/schema/index";
import { insertFloor, insertSpace } from "./audits";
import { insertGrant, insertNetwork, insertSite, insertUser } from "./records";

/**
 * A site with a facilities lead, an auditor and an administrator, and a room whose monitor was
 * mapped at `mappedAt` (alarms start no earlier than the mapping).
 */
export async function insertMonitoredRoom(
  db: Database,
  options: {
    mappedAt: Date;
    zoneType?: ZoneType;
    thresholdPa?: number | null;
    settings?: { graceSeconds?: number; doorGraceSeconds?: number; actionLimitMinutes?: number };
  },
) {
  const network = await insertNetwork(db);
  const site = await insertSite(db, network.id);
  const floor = await insertFloor(db, site.id);
  const space = await insertSpace(db, floor, options.zoneType ?? "isolation_room");
  const lead = await insertUser(db, network.id);
  await insertGrant(db, lead.id, "facilities_lead", site.id);
  const auditor = await insertUser(db, network.id);
  await insertGrant(db, auditor.id, "auditor", site.id);
  const admin = await insertUser(db, network.id);
  await insertGrant(db, admin.id, "administrator", site.id);
  const monitorId = `h2-${space.id.slice(0, 8)}`;
  const [monitor] = await db
    .insert(pressureMonitors)
    .values({
      monitorId,
      siteId: site.id,
      spaceId: space.id,
      thresholdPa: options.thresholdPa ?? null,
      createdAt: options.mappedAt,
    })
    .returning();
  if (options.settings)
    await db.insert(pressureSiteSettings).values({ siteId: site.id, ...options.settings });
  return { network, site, floor, space, lead, auditor, admin, monitor: monitor!, monitorId };
}

/**
 * A timeline of readings every `stepSeconds` from `start`: `pressure(secondsSinceStart)` gives
 * the value in Pa (or the unit given), `door` the door state.
 */
export function timeline(
  monitorId: string,
  start: Date,
  seconds: number,
  stepSeconds: number,
  pressure: (t: number) => number,
  options: { unit?: "Pa" | "inH2O"; door?: (t: number) => "open" | "closed" | null } = {},
): PressureReading[] {
  const readings: PressureReading[] = [];
  for (let t = 0; t < seconds; t += stepSeconds)
    readings.push({
      monitorId,
      measuredAt: new Date(start.getTime() + t * 1000),
      pressure: pressure(t),
      unit: options.unit ?? "Pa",
      door: options.door?.(t) ?? null,
    });
  return readings;
}
