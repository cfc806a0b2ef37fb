import { and, asc, desc, eq, gte, inArray, isNull, lt, lte, or, sql } from "drizzle-orm";

import type { DbOrTx } from "../../db/client";
import { pressureReadings } from "../../db/partitioned/pressure-readings";
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

const readingColumns = {
  monitorId: pressureReadings.monitorId,
  measuredAt: pressureReadings.measuredAt,
  pressure: pressureReadings.pressure,
  unit: pressureReadings.unit,
  door: pressureReadings.door,
};

/** A monitor's readings from `from` to `to` (both included), in time order. */
export function readingsBetween(
  db: DbOrTx,
  monitorId: string,
  from: Date,
  to: Date,
): Promise<StoredReading[]> {
  return db
    .select(readingColumns)
    .from(pressureReadings)
    .where(
      and(
        eq(pressureReadings.monitorId, monitorId),
        gte(pressureReadings.measuredAt, from),
        lte(pressureReadings.measuredAt, to),
      ),
    )
    .orderBy(asc(pressureReadings.measuredAt));
}

/** The last reading before `before`, at or after `notBefore`. */
export async function readingBefore(
  db: DbOrTx,
  monitorId: string,
  before: Date,
  notBefore: Date,
): Promise<StoredReading | null> {
  const [row] = await db
    .select(readingColumns)
    .from(pressureReadings)
    .where(
      and(
        eq(pressureReadings.monitorId, monitorId),
        lt(pressureReadings.measuredAt, before),
        gte(pressureReadings.measuredAt, notBefore),
      ),
    )
    .orderBy(desc(pressureReadings.measuredAt))
    .limit(1);
  return row ?? null;
}

export type AlarmRow = typeof pressureAlarms.$inferSelect;

/** The monitor's alarms still open, or ended at or after `from`. */
export function alarmsSince(db: DbOrTx, monitorRowId: string, from: Date): Promise<AlarmRow[]> {
  return db
    .select()
    .from(pressureAlarms)
    .where(
      and(
        eq(pressureAlarms.monitorRowId, monitorRowId),
        or(isNull(pressureAlarms.endedAt), gte(pressureAlarms.endedAt, from)),
      ),
    )
    .orderBy(asc(pressureAlarms.startedAt));
}

/** The earliest start of the monitor's open alarms. */
export async function earliestOpenAlarm(db: DbOrTx, monitorRowId: string): Promise<Date | null> {
  const [row] = await db
    .select({ at: sql<string | null>`min(${pressureAlarms.startedAt})` })
    .from(pressureAlarms)
    .where(and(eq(pressureAlarms.monitorRowId, monitorRowId), isNull(pressureAlarms.endedAt)));
  return row?.at ? new Date(row.at) : null;
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

/** A retired room's open alarms end at its retirement, quietly: its monitor no longer alarms. */
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

/** Judged through here: the next evaluation looks back from it. Only moves forward. */
export async function markEvaluated(db: DbOrTx, id: string, through: Date): Promise<void> {
  await db
    .update(pressureMonitors)
    .set({
      evaluatedThrough: sql`greatest(coalesce(${pressureMonitors.evaluatedThrough}, ${through.toISOString()}::timestamptz), ${through.toISOString()}::timestamptz)`,
    })
    .where(eq(pressureMonitors.id, id));
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
