import { randomUUID } from "node:crypto";

import type { PressureReading } from "@shared/schemas/pressure-readings";

import type { Database } from "../../server/db/client";
import { pressureAlarms, pressureMonitors } from "../../server/db/schema/index";
import { storeReadings } from "../../server/modules/pressure/readings.repository";

/** A monitor mapped to the space (one per room), with the room's own threshold if given. */
export async function insertMonitorH4(
  db: Database,
  space: { id: string; siteId: string },
  overrides: { monitorId?: string; thresholdPa?: number | null } = {},
) {
  const [row] = await db
    .insert(pressureMonitors)
    .values({
      monitorId: overrides.monitorId ?? `mon-${randomUUID().slice(0, 12)}`,
      siteId: space.siteId,
      spaceId: space.id,
      thresholdPa: overrides.thresholdPa ?? null,
    })
    .returning();
  return row!;
}

/** Readings for one monitor, one every `everySeconds` from `from`, with the pressures given (Pa). */
export function readingsH4(
  monitorId: string,
  from: Date,
  pressures: readonly number[],
  options: { everySeconds?: number; door?: "open" | "closed" | null } = {},
): PressureReading[] {
  const step = (options.everySeconds ?? 5) * 1000;
  return pressures.map((pressure, index) => ({
    monitorId,
    measuredAt: new Date(from.getTime() + index * step),
    pressure,
    unit: "Pa",
    door: options.door ?? null,
  }));
}

/** Stores readings as the ingest would (raw rows and roll-ups). */
export async function storeReadingsH4(
  db: Database,
  readings: readonly PressureReading[],
  now: Date = new Date(),
) {
  return storeReadings(db, readings, { source: "upload", now });
}

/** An alarm row as the alarm job would write it: open unless `endedAt` is given. */
export async function insertAlarmH4(
  db: Database,
  monitor: { id: string; monitorId: string; siteId: string; spaceId: string },
  overrides: Partial<typeof pressureAlarms.$inferInsert> = {},
) {
  const startedAt = overrides.startedAt ?? new Date(Date.now() - 6 * 60_000);
  const [row] = await db
    .insert(pressureAlarms)
    .values({
      monitorRowId: monitor.id,
      monitorId: monitor.monitorId,
      siteId: monitor.siteId,
      spaceId: monitor.spaceId,
      kind: "out_of_range",
      startedAt,
      alarmAt: new Date(startedAt.getTime() + 60_000),
      worstValue: 1.2,
      worstUnit: "Pa",
      worstPa: 1.2,
      worstAt: new Date(startedAt.getTime() + 120_000),
      ...overrides,
    })
    .returning();
  return row!;
}
