import { and, asc, count, desc, eq, gte, isNull, lt, lte, or } from "drizzle-orm";

import type { DbOrTx } from "../../db/client";
import { pressureReadings } from "../../db/partitioned/pressure-readings";
import {
  pressureAlarms,
  pressureHours,
  pressureMinutes,
  pressureMonitors,
  sites,
  spaces,
  users,
} from "../../db/schema/index";

/** The space as the pressure section needs it, with its site's time zone. */
export async function findSpace(db: DbOrTx, spaceId: string, options: { lock?: boolean } = {}) {
  const query = db
    .select({
      id: spaces.id,
      siteId: spaces.siteId,
      name: spaces.name,
      zoneType: spaces.zoneType,
      retiredAt: spaces.retiredAt,
      timeZone: sites.timeZone,
    })
    .from(spaces)
    .innerJoin(sites, eq(sites.id, spaces.siteId))
    .where(eq(spaces.id, spaceId));
  // Locks the space row only: a retirement updates it, so mapping and retiring take turns.
  const [row] = options.lock ? await query.for("update", { of: spaces }) : await query;
  return row ?? null;
}

export type MonitorRow = typeof pressureMonitors.$inferSelect;

export async function findMonitorOfSpace(db: DbOrTx, spaceId: string): Promise<MonitorRow | null> {
  const [row] = await db
    .select()
    .from(pressureMonitors)
    .where(eq(pressureMonitors.spaceId, spaceId));
  return row ?? null;
}

/** Where a monitor id is mapped, with the room's name and site. */
export async function findMapping(db: DbOrTx, monitorId: string) {
  const [row] = await db
    .select({
      id: pressureMonitors.id,
      spaceId: pressureMonitors.spaceId,
      siteId: pressureMonitors.siteId,
      spaceName: spaces.name,
    })
    .from(pressureMonitors)
    .innerJoin(spaces, eq(spaces.id, pressureMonitors.spaceId))
    .where(eq(pressureMonitors.monitorId, monitorId));
  return row ?? null;
}

export async function insertMonitor(
  db: DbOrTx,
  values: typeof pressureMonitors.$inferInsert,
): Promise<MonitorRow> {
  const [row] = await db.insert(pressureMonitors).values(values).returning();
  return row!;
}

export async function updateMonitor(
  db: DbOrTx,
  id: string,
  values: Partial<typeof pressureMonitors.$inferInsert>,
): Promise<MonitorRow> {
  const [row] = await db
    .update(pressureMonitors)
    .set({ ...values, updatedAt: new Date() })
    .where(eq(pressureMonitors.id, id))
    .returning();
  return row!;
}

export async function deleteMonitor(db: DbOrTx, id: string): Promise<void> {
  await db.delete(pressureMonitors).where(eq(pressureMonitors.id, id));
}

/** The monitor's latest reading at or before `now` (a reading a little ahead is not yet shown). */
export async function latestReading(db: DbOrTx, monitorId: string, now: Date) {
  const [row] = await db
    .select({
      measuredAt: pressureReadings.measuredAt,
      pressure: pressureReadings.pressure,
      unit: pressureReadings.unit,
      pressurePa: pressureReadings.pressurePa,
      door: pressureReadings.door,
    })
    .from(pressureReadings)
    .where(and(eq(pressureReadings.monitorId, monitorId), lte(pressureReadings.measuredAt, now)))
    .orderBy(desc(pressureReadings.measuredAt))
    .limit(1);
  return row ?? null;
}

/** The room's open alarms (out of range, no readings), newest first. */
export async function openAlarms(db: DbOrTx, spaceId: string) {
  return db
    .select({ id: pressureAlarms.id, kind: pressureAlarms.kind })
    .from(pressureAlarms)
    .where(and(eq(pressureAlarms.spaceId, spaceId), isNull(pressureAlarms.endedAt)))
    .orderBy(desc(pressureAlarms.startedAt));
}

/**
 * One monitor's roll-ups from `from` (inclusive) to `to` (inclusive), in time order. The filter is
 * the roll-up tables' primary key (monitor id, bucket start), so the read is one index range.
 */
export function rollUpQuery(
  db: DbOrTx,
  size: "minute" | "hour",
  monitorId: string,
  from: Date,
  to: Date,
) {
  const table = size === "minute" ? pressureMinutes : pressureHours;
  return db
    .select({
      bucketStart: table.bucketStart,
      readings: table.readings,
      sumPa: table.sumPa,
      minPa: table.minPa,
      maxPa: table.maxPa,
      doorOpenReadings: table.doorOpenReadings,
    })
    .from(table)
    .where(
      and(eq(table.monitorId, monitorId), gte(table.bucketStart, from), lte(table.bucketStart, to)),
    )
    .orderBy(asc(table.bucketStart));
}

const overlaps = (from: Date, to: Date) =>
  and(
    lt(pressureAlarms.startedAt, to),
    or(isNull(pressureAlarms.endedAt), gte(pressureAlarms.endedAt, from)),
  );

/** The room's alarms that overlap the range, newest first, at most `limit`, with who acknowledged. */
export async function alarmsInRange(
  db: DbOrTx,
  spaceId: string,
  from: Date,
  to: Date,
  limit: number,
) {
  const where = and(eq(pressureAlarms.spaceId, spaceId), overlaps(from, to));
  const rows = await db
    .select({
      id: pressureAlarms.id,
      kind: pressureAlarms.kind,
      startedAt: pressureAlarms.startedAt,
      endedAt: pressureAlarms.endedAt,
      worstValue: pressureAlarms.worstValue,
      worstUnit: pressureAlarms.worstUnit,
      worstPa: pressureAlarms.worstPa,
      worstAt: pressureAlarms.worstAt,
      criticalAt: pressureAlarms.criticalAt,
      acknowledgedAt: pressureAlarms.acknowledgedAt,
      acknowledgedByName: users.displayName,
      acknowledgementNote: pressureAlarms.acknowledgementNote,
    })
    .from(pressureAlarms)
    .leftJoin(users, eq(users.id, pressureAlarms.acknowledgedBy))
    .where(where)
    .orderBy(desc(pressureAlarms.startedAt))
    .limit(limit);
  const [total] = await db.select({ n: count() }).from(pressureAlarms).where(where);
  return { rows, total: total?.n ?? 0 };
}

/** Every excursion's span in the range (for the table's minutes in excursion). */
export async function excursionSpans(db: DbOrTx, spaceId: string, from: Date, to: Date) {
  return db
    .select({ startedAt: pressureAlarms.startedAt, endedAt: pressureAlarms.endedAt })
    .from(pressureAlarms)
    .where(
      and(
        eq(pressureAlarms.spaceId, spaceId),
        eq(pressureAlarms.kind, "out_of_range"),
        overlaps(from, to),
      ),
    )
    .orderBy(asc(pressureAlarms.startedAt))
    .limit(10_000);
}

/** For the mapping's change log: the monitor as it reads. */
export const shownMonitor = (row: MonitorRow) => ({
  monitorId: row.monitorId,
  thresholdPa: row.thresholdPa,
});
