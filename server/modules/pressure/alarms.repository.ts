import { and, asc, eq, gte, inArray, isNull, or, sql } from "drizzle-orm";

import type { DbOrTx } from "../../db/client";
import {
  pressureAlarmRecipients,
  pressureAlarms,
  pressureMonitors,
  pressureSiteSettings,
  roleGrants,
  sites,
  spaces,
  users,
} from "../../db/schema/index";

/** A mapped monitor with what the alarm job needs to judge it. */
export interface WatchedMonitor {
  id: string;
  monitorId: string;
  siteId: string;
  spaceId: string;
  thresholdPa: number | null;
  evaluatedThrough: Date | null;
  createdAt: Date;
  spaceName: string;
  zoneType: "isolation_room" | "anteroom" | "donning_zone" | "doffing_area";
  spaceRetiredAt: Date | null;
  siteName: string;
  timeZone: string;
  networkId: string;
  graceSeconds: number | null;
  doorGraceSeconds: number | null;
  actionLimitMinutes: number | null;
}

const watchedColumns = {
  id: pressureMonitors.id,
  monitorId: pressureMonitors.monitorId,
  siteId: pressureMonitors.siteId,
  spaceId: pressureMonitors.spaceId,
  thresholdPa: pressureMonitors.thresholdPa,
  evaluatedThrough: pressureMonitors.evaluatedThrough,
  createdAt: pressureMonitors.createdAt,
  spaceName: spaces.name,
  zoneType: spaces.zoneType,
  spaceRetiredAt: spaces.retiredAt,
  siteName: sites.name,
  timeZone: sites.timeZone,
  networkId: sites.networkId,
  graceSeconds: pressureSiteSettings.graceSeconds,
  doorGraceSeconds: pressureSiteSettings.doorGraceSeconds,
  actionLimitMinutes: pressureSiteSettings.actionLimitMinutes,
};

function watchedQuery(db: DbOrTx) {
  return db
    .select(watchedColumns)
    .from(pressureMonitors)
    .innerJoin(spaces, eq(spaces.id, pressureMonitors.spaceId))
    .innerJoin(sites, eq(sites.id, pressureMonitors.siteId))
    .leftJoin(pressureSiteSettings, eq(pressureSiteSettings.siteId, pressureMonitors.siteId));
}

/** Every mapped monitor, or those with the given building ids. */
export async function watchedMonitors(
  db: DbOrTx,
  monitorIds?: readonly string[],
): Promise<WatchedMonitor[]> {
  if (monitorIds && monitorIds.length === 0) return [];
  const query = watchedQuery(db);
  const rows = await (
    monitorIds ? query.where(inArray(pressureMonitors.monitorId, [...monitorIds])) : query
  ).orderBy(asc(pressureMonitors.spaceId));
  return rows;
}

/** The monitor's row locked: one alarm evaluation of a monitor at a time, across processes. */
export async function lockMonitor(db: DbOrTx, id: string): Promise<WatchedMonitor | null> {
  const [locked] = await db
    .select({ id: pressureMonitors.id })
    .from(pressureMonitors)
    .where(eq(pressureMonitors.id, id))
    .for("update");
  if (!locked) return null;
  const [row] = await watchedQuery(db).where(eq(pressureMonitors.id, id));
  return row ?? null;
}

export interface StoredReading {
  monitorId: string;
  measuredAt: Date;
  pressure: number;
  unit: "Pa" | "inH2O";
  door: "open" | "closed" | null;
}

export type AlarmRow = typeof pressureAlarms.$inferSelect;

/** Per monitor, the window of readings to read: from `from` (included) to `to` (included). */
export interface ReadingWindow {
  monitorId: string;
  from: Date;
  /** Where the mapping began: the reading before the window is looked for from here. */
  notBefore: Date;
}

type RawReading = {
  monitor_id: string;
  measured_at: string | Date;
  pressure: number;
  unit: "Pa" | "inH2O";
  door: "open" | "closed" | null;
};

const fromRaw = (row: RawReading): StoredReading => ({
  monitorId: row.monitor_id,
  measuredAt: new Date(row.measured_at),
  pressure: Number(row.pressure),
  unit: row.unit,
  door: row.door,
});

function windowArrays(windows: readonly ReadingWindow[]) {
  return {
    ids: sql.param(windows.map((w) => w.monitorId)),
    froms: sql.param(windows.map((w) => w.from.toISOString())),
    notBefores: sql.param(windows.map((w) => w.notBefore.toISOString())),
  };
}

/** Many monitors' readings in their windows, in one statement; grouped by monitor, in time order. */
export async function readingsInWindows(
  db: DbOrTx,
  windows: readonly ReadingWindow[],
  to: Date,
): Promise<Map<string, StoredReading[]>> {
  const grouped = new Map<string, StoredReading[]>();
  if (windows.length === 0) return grouped;
  const { ids, froms } = windowArrays(windows);
  const result = await db.execute<RawReading>(sql`
    select r.monitor_id, r.measured_at, r.pressure, r.unit, r.door
    from unnest(${ids}::varchar[], ${froms}::timestamptz[]) as w(monitor_id, from_at)
    cross join lateral (
      select monitor_id, measured_at, pressure, unit, door from pressure_readings
      where monitor_id = w.monitor_id and measured_at >= w.from_at and measured_at <= ${to.toISOString()}::timestamptz
      order by measured_at
    ) r`);
  for (const row of result.rows) {
    const reading = fromRaw(row);
    const list = grouped.get(reading.monitorId) ?? [];
    list.push(reading);
    grouped.set(reading.monitorId, list);
  }
  return grouped;
}

/** For each window, the last reading before it (not before the mapping), in one statement. */
export async function readingsBeforeWindows(
  db: DbOrTx,
  windows: readonly ReadingWindow[],
): Promise<Map<string, StoredReading>> {
  const found = new Map<string, StoredReading>();
  const asked = windows.filter((w) => w.from > w.notBefore);
  if (asked.length === 0) return found;
  const { ids, froms, notBefores } = windowArrays(asked);
  const result = await db.execute<RawReading>(sql`
    select r.monitor_id, r.measured_at, r.pressure, r.unit, r.door
    from unnest(${ids}::varchar[], ${froms}::timestamptz[], ${notBefores}::timestamptz[])
      as w(monitor_id, from_at, not_before)
    cross join lateral (
      select monitor_id, measured_at, pressure, unit, door from pressure_readings
      where monitor_id = w.monitor_id and measured_at < w.from_at and measured_at >= w.not_before
      order by measured_at desc limit 1
    ) r`);
  for (const row of result.rows) found.set(row.monitor_id, fromRaw(row));
  return found;
}

/** The monitors' alarms still open, or ended at or after `from`. */
export function alarmsOfMonitorsSince(
  db: DbOrTx,
  monitorRowIds: readonly string[],
  from: Date,
): Promise<AlarmRow[]> {
  if (monitorRowIds.length === 0) return Promise.resolve([]);
  return db
    .select()
    .from(pressureAlarms)
    .where(
      and(
        inArray(pressureAlarms.monitorRowId, [...monitorRowIds]),
        or(isNull(pressureAlarms.endedAt), gte(pressureAlarms.endedAt, from)),
      ),
    )
    .orderBy(asc(pressureAlarms.startedAt));
}

/** The earliest start of each monitor's open alarms. */
export async function earliestOpenAlarms(
  db: DbOrTx,
  monitorRowIds: readonly string[],
): Promise<Map<string, Date>> {
  const found = new Map<string, Date>();
  if (monitorRowIds.length === 0) return found;
  const rows = await db
    .select({
      monitorRowId: pressureAlarms.monitorRowId,
      at: sql<string>`min(${pressureAlarms.startedAt})`,
    })
    .from(pressureAlarms)
    .where(
      and(inArray(pressureAlarms.monitorRowId, [...monitorRowIds]), isNull(pressureAlarms.endedAt)),
    )
    .groupBy(pressureAlarms.monitorRowId);
  for (const row of rows) if (row.monitorRowId) found.set(row.monitorRowId, new Date(row.at));
  return found;
}

/** Judged through these times (each only moves forward), in one statement. */
export async function markManyEvaluated(
  db: DbOrTx,
  marks: readonly { id: string; through: Date }[],
): Promise<void> {
  if (marks.length === 0) return;
  await db.execute(sql`
    update pressure_monitors m
    set evaluated_through = greatest(coalesce(m.evaluated_through, w.through), w.through)
    from unnest(${sql.param(marks.map((mark) => mark.id))}::uuid[],
                ${sql.param(marks.map((mark) => mark.through.toISOString()))}::timestamptz[])
      as w(id, through)
    where m.id = w.id`);
}

export async function insertAlarm(
  db: DbOrTx,
  values: typeof pressureAlarms.$inferInsert,
): Promise<AlarmRow | null> {
  const [row] = await db.insert(pressureAlarms).values(values).onConflictDoNothing().returning();
  return row ?? null;
}

export async function updateAlarm(
  db: DbOrTx,
  id: string,
  changes: Partial<typeof pressureAlarms.$inferInsert>,
): Promise<void> {
  await db
    .update(pressureAlarms)
    .set({ ...changes, updatedAt: new Date() })
    .where(eq(pressureAlarms.id, id));
}

/**
 * A monitor's open alarms end at `retiredAt`, quietly: its room was retired, or the monitor was
 * taken off the room, so it no longer alarms there.
 */
export async function endAlarmsOfRetiredSpace(
  db: DbOrTx,
  monitorRowId: string,
  retiredAt: Date,
): Promise<number> {
  const rows = await db
    .update(pressureAlarms)
    .set({
      endedAt: sql`greatest(${pressureAlarms.startedAt}, ${retiredAt.toISOString()}::timestamptz)`,
      updatedAt: new Date(),
    })
    .where(and(eq(pressureAlarms.monitorRowId, monitorRowId), isNull(pressureAlarms.endedAt)))
    .returning({ id: pressureAlarms.id });
  return rows.length;
}

// ---------------------------------------------------------------------------------------------
// Settings and recipients

export interface Person {
  id: string;
  name: string;
  email: string;
}

export async function settingsOf(db: DbOrTx, siteId: string) {
  const [row] = await db
    .select()
    .from(pressureSiteSettings)
    .where(eq(pressureSiteSettings.siteId, siteId));
  return row ?? null;
}

export async function saveSettings(
  db: DbOrTx,
  siteId: string,
  values: {
    graceSeconds: number | null;
    doorGraceSeconds: number | null;
    actionLimitMinutes: number | null;
    recipientsChosen: boolean;
    updatedBy: string | null;
  },
): Promise<void> {
  const now = new Date();
  await db
    .insert(pressureSiteSettings)
    .values({ siteId, ...values, updatedAt: now })
    .onConflictDoUpdate({
      target: pressureSiteSettings.siteId,
      set: { ...values, updatedAt: now },
    });
}

export async function chosenRecipientIds(db: DbOrTx, siteId: string): Promise<string[]> {
  const rows = await db
    .select({ userId: pressureAlarmRecipients.userId })
    .from(pressureAlarmRecipients)
    .where(eq(pressureAlarmRecipients.siteId, siteId))
    .orderBy(asc(pressureAlarmRecipients.createdAt), asc(pressureAlarmRecipients.userId));
  return rows.map((row) => row.userId);
}

export async function replaceRecipients(
  db: DbOrTx,
  siteId: string,
  userIds: readonly string[],
): Promise<void> {
  await db.delete(pressureAlarmRecipients).where(eq(pressureAlarmRecipients.siteId, siteId));
  if (userIds.length > 0)
    await db.insert(pressureAlarmRecipients).values(userIds.map((userId) => ({ siteId, userId })));
}

/**
 * Active people with a role at the site (a grant for the site, or a network-wide one in its
 * network), with their roles there. Another network's placeholders never appear.
 */
export async function peopleOfSite(
  db: DbOrTx,
  siteId: string,
): Promise<(Person & { roles: string[] })[]> {
  const rows = await db
    .select({
      id: users.id,
      name: users.displayName,
      email: users.email,
      role: roleGrants.role,
    })
    .from(roleGrants)
    .innerJoin(users, eq(users.id, roleGrants.userId))
    .innerJoin(sites, eq(sites.id, siteId))
    .where(
      and(
        or(
          eq(roleGrants.siteId, siteId),
          and(isNull(roleGrants.siteId), eq(users.networkId, sites.networkId)),
        ),
        isNull(users.deactivatedAt),
        eq(users.heldElsewhere, false),
      ),
    )
    .orderBy(asc(users.displayName), asc(users.id));
  const people = new Map<string, Person & { roles: string[] }>();
  for (const row of rows) {
    const person = people.get(row.id) ?? {
      id: row.id,
      name: row.name,
      email: row.email,
      roles: [],
    };
    if (!person.roles.includes(row.role)) person.roles.push(row.role);
    people.set(row.id, person);
  }
  return [...people.values()];
}
