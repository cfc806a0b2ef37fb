import { randomUUID } from "node:crypto";

import type { PressureReading, PressureUnit } from "@shared/schemas/pressure-readings";

import type { Database } from "../../server/db/client";
import { pressureAlarms, pressureMonitors } from "../../server/db/schema/index";
import { storeReadings } from "../../server/modules/pressure/readings.repository";
import { insertFloor, insertSpace } from "./audits";

/** A monitor id no other test uses. */
export const freshMonitorId = (prefix = "room") => `${prefix}-${randomUUID().slice(0, 8)}`;

/** An isolation room on a fresh floor of the site, with a monitor mapped to it. */
export async function insertMonitoredRoom(
  db: Database,
  siteId: string,
  options: { thresholdPa?: number | null; monitorId?: string; createdAt?: Date } = {},
) {
  const floor = await insertFloor(db, siteId);
  const space = await insertSpace(db, floor, "isolation_room");
  const [monitor] = await db
    .insert(pressureMonitors)
    .values({
      monitorId: options.monitorId ?? freshMonitorId(),
      siteId,
      spaceId: space.id,
      thresholdPa: options.thresholdPa ?? null,
      ...(options.createdAt ? { createdAt: options.createdAt } : {}),
    })
    .returning();
  return { floor, space, monitor: monitor! };
}

/** A monitor mapped to an existing room (a demo room in the browser tests). */
export async function mapMonitorTo(
  db: Database,
  space: { id: string; siteId: string },
  options: { thresholdPa?: number | null; monitorId?: string } = {},
) {
  const [monitor] = await db
    .insert(pressureMonitors)
    .values({
      monitorId: options.monitorId ?? freshMonitorId(),
      siteId: space.siteId,
      spaceId: space.id,
      thresholdPa: options.thresholdPa ?? null,
    })
    .returning();
  return monitor!;
}

/**
 * Readings every `everySeconds` from `from` for `count` readings, with the pressure each one gets
 * from `pressureAt(i)`; stored through the real storage (raw rows and roll-ups).
 */
export async function storeTimeline(
  db: Database,
  monitorId: string,
  options: {
    from: Date;
    count: number;
    everySeconds: number;
    pressureAt: (index: number) => number;
    unit?: PressureUnit;
    doorAt?: (index: number) => "open" | "closed" | null;
    now?: Date;
  },
): Promise<PressureReading[]> {
  const readings: PressureReading[] = [];
  for (let i = 0; i < options.count; i += 1)
    readings.push({
      monitorId,
      measuredAt: new Date(options.from.getTime() + i * options.everySeconds * 1000),
      pressure: options.pressureAt(i),
      unit: options.unit ?? "Pa",
      door: options.doorAt?.(i) ?? null,
    });
  await storeReadings(db, readings, { source: "upload", now: options.now ?? new Date() });
  return readings;
}

/** An alarm row as the alarm job writes it (the job is another part's; tests write the row). */
export async function insertPressureAlarm(
  db: Database,
  monitor: { id: string; monitorId: string; siteId: string; spaceId: string },
  values: {
    kind?: "out_of_range" | "no_readings";
    startedAt: Date;
    endedAt?: Date | null;
    worst?: { value: number; unit: PressureUnit; pa: number; at: Date };
    criticalAt?: Date | null;
    acknowledged?: { by: string; at: Date; note: string };
  },
) {
  const [row] = await db
    .insert(pressureAlarms)
    .values({
      monitorRowId: monitor.id,
      monitorId: monitor.monitorId,
      siteId: monitor.siteId,
      spaceId: monitor.spaceId,
      kind: values.kind ?? "out_of_range",
      startedAt: values.startedAt,
      alarmAt: new Date(values.startedAt.getTime() + 60_000),
      endedAt: values.endedAt ?? null,
      worstValue: values.worst?.value ?? null,
      worstUnit: values.worst?.unit ?? null,
      worstPa: values.worst?.pa ?? null,
      worstAt: values.worst?.at ?? null,
      criticalAt: values.criticalAt ?? null,
      acknowledgedAt: values.acknowledged?.at ?? null,
      acknowledgedBy: values.acknowledged?.by ?? null,
      acknowledgementNote: values.acknowledged?.note ?? null,
    })
    .returning();
  return row!;
}
