import { meetsPressureThreshold, pressureFigureIn } from "@shared/calc/answer-rules";
import { defaultExcursionPolicy } from "@shared/calc/pressure-excursions";
import { minimumNegativePressurePascals } from "@shared/calc/ventilation";
import type { PressureUnit } from "@shared/schemas/pressure-readings";
import {
  maxListedAlarms,
  type MonitorMappingBody,
  type PressureAlarmEntry,
  type PressureLive,
  type PressureMonitor,
  type PressurePoint,
  type PressureRange,
  type PressureSpaceResponse,
  type PressureTableRow,
} from "@shared/schemas/pressure-space";

import type { Database, DbOrTx } from "../../db/client";
import { AppError, notFound } from "../../lib/app-error";
import { recordChange, type Actor } from "../../lib/change-log";
import { databaseCodeOf } from "../../lib/database-errors";
import { endAlarmsOfRetiredSpace } from "./alarms.repository";
import * as repo from "./space.repository";

const minute = 60_000;
const hour = 60 * minute;
const day = 24 * hour;

/** Only isolation rooms take a monitor: see `takesMonitor`. */
export function takesMonitor(zoneType: string): boolean {
  // The alarm judges against the CDC's figure for an airborne isolation room (negative to the
  // corridor) and a long excursion becomes a finding on the room's `room.pressure` item, which
  // only isolation rooms' checklists have. An anteroom's differential depends on the suite's
  // design (its own item is common practice, and some anterooms are meant to be neutral or
  // positive to the room), so a monitor there would alarm on a figure that may not apply.
  return zoneType === "isolation_room";
}

export const siteOfSpace = async (db: Database, spaceId: string) =>
  (await repo.findSpace(db, spaceId))?.siteId ?? null;

const conflict = (message: string, field?: string) =>
  new AppError("conflict", 409, message, field ? { fields: { [field]: message } } : undefined);

function thresholdWords(isDefault: boolean): string {
  if (isDefault)
    return `Lintel's default: the CDC's figure for airborne isolation rooms, ${minimumNegativePressurePascals} Pa (0.01 in. w.c.) negative to the corridor.`;
  return "This room's own threshold, stricter than the CDC's 2.5 Pa.";
}

function toMonitor(row: repo.MonitorRow, unit: PressureUnit): PressureMonitor {
  const isDefault = row.thresholdPa === null;
  const thresholdPa = row.thresholdPa ?? -minimumNegativePressurePascals;
  return {
    monitorId: row.monitorId,
    thresholdPa,
    thresholdIsDefault: isDefault,
    unit,
    thresholdInUnit: pressureFigureIn(unit, thresholdPa),
    thresholdWords: thresholdWords(isDefault),
    mappedAt: row.createdAt.toISOString(),
  };
}

/** Where the range starts: whole hours, at least 24 hours or 30 days back. */
export function rangeBounds(range: PressureRange, now: Date): { from: Date; to: Date } {
  const hourStart = Math.floor(now.getTime() / hour) * hour;
  return { from: new Date(hourStart - (range === "24h" ? day : 30 * day)), to: now };
}

/** The day a moment falls on in the site's time zone, as YYYY-MM-DD. */
function localDay(at: Date, timeZone: string): string {
  return new Intl.DateTimeFormat("en-CA", {
    timeZone,
    year: "numeric",
    month: "2-digit",
    day: "2-digit",
  }).format(at);
}

/** Minutes of [from, to) inside any of the spans (a span still open runs to `now`). */
function minutesInside(
  from: number,
  to: number,
  spans: readonly { startedAt: Date; endedAt: Date | null }[],
  now: number,
): number {
  let total = 0;
  for (const span of spans) {
    const start = Math.max(from, span.startedAt.getTime());
    const end = Math.min(to, span.endedAt?.getTime() ?? now);
    if (end > start) total += end - start;
  }
  return Math.round((total / minute) * 10) / 10;
}

interface Bucket {
  at: Date;
  readings: number;
  sumPa: number;
  minPa: number;
  maxPa: number;
}

/**
 * The table's rows: each hour of the 24-hour range, or each day (in the site's time zone) of the
 * 30-day range, from the same roll-ups the chart draws; rows without readings are kept, empty.
 */
export function tableRows(
  range: PressureRange,
  bounds: { from: Date; to: Date },
  buckets: readonly Bucket[],
  spans: readonly { startedAt: Date; endedAt: Date | null }[],
  timeZone: string,
): PressureTableRow[] {
  const groups: { key: string; from: number; to: number; buckets: Bucket[] }[] = [];
  const now = bounds.to.getTime();
  for (let at = bounds.from.getTime(); at <= now; at += hour) {
    const key = range === "24h" ? String(at) : localDay(new Date(at), timeZone);
    const last = groups.at(-1);
    if (last && last.key === key) last.to = at + hour;
    else groups.push({ key, from: at, to: at + hour, buckets: [] });
  }
  let index = 0;
  for (const bucket of buckets) {
    const at = bucket.at.getTime();
    while (index < groups.length - 1 && at >= groups[index]!.to) index += 1;
    groups[index]?.buckets.push(bucket);
  }
  return groups.map((group) => {
    const to = Math.min(group.to, now);
    const readings = group.buckets.reduce((sum, b) => sum + b.readings, 0);
    const sumPa = group.buckets.reduce((sum, b) => sum + b.sumPa, 0);
    return {
      from: new Date(group.from).toISOString(),
      to: new Date(to).toISOString(),
      readings,
      meanPa: readings > 0 ? sumPa / readings : null,
      minPa: readings > 0 ? Math.min(...group.buckets.map((b) => b.minPa)) : null,
      maxPa: readings > 0 ? Math.max(...group.buckets.map((b) => b.maxPa)) : null,
      excursionMinutes: minutesInside(group.from, to, spans, now),
    };
  });
}

/**
 * A room's pressure for its page: the monitor mapped to it, the live value and state, the chart's
 * series and table for the range, and the alarms in it. The state now comes from the alarm log
 * (an open excursion or silence); a latest reading older than the silence limit is "no readings"
 * even before the alarm job has written it, so a stale value is never shown as live.
 */
export async function pressureOfSpace(
  db: Database,
  spaceId: string,
  range: PressureRange,
  now: Date,
): Promise<PressureSpaceResponse> {
  const space = await repo.findSpace(db, spaceId);
  if (!space) throw notFound("That space");
  const bounds = rangeBounds(range, now);
  const monitorRow = await repo.findMonitorOfSpace(db, spaceId);
  const latest = monitorRow ? await repo.latestReading(db, monitorRow.monitorId, now) : null;
  const monitor = monitorRow ? toMonitor(monitorRow, latest?.unit ?? "Pa") : null;

  let live: PressureLive | null = null;
  if (monitor) {
    const open = await repo.openAlarms(db, spaceId);
    const silent = open.find((alarm) => alarm.kind === "no_readings");
    const excursion = open.find((alarm) => alarm.kind === "out_of_range");
    const meets = latest
      ? meetsPressureThreshold(latest.pressure, latest.unit, {
          op: "<=",
          value: monitor.thresholdPa,
        })
      : false;
    let state: PressureLive["state"];
    if (silent) state = "no_readings";
    else if (excursion) state = "excursion";
    else if (!latest) state = "never_reported";
    else if (now.getTime() - latest.measuredAt.getTime() >= defaultExcursionPolicy.silenceMs)
      state = "no_readings";
    else state = meets ? "in_range" : "out_of_range";
    live = {
      state,
      latest: latest
        ? {
            measuredAt: latest.measuredAt.toISOString(),
            pressure: latest.pressure,
            unit: latest.unit,
            pressurePa: latest.pressurePa,
            door: latest.door,
            meetsThreshold: meets,
          }
        : null,
      openAlarmId: (silent ?? excursion)?.id ?? null,
    };
  }

  const size = range === "24h" ? "minute" : "hour";
  const buckets = monitorRow
    ? (await repo.rollUpQuery(db, size, monitorRow.monitorId, bounds.from, now)).map((row) => ({
        at: row.bucketStart,
        readings: row.readings,
        sumPa: row.sumPa,
        minPa: row.minPa,
        maxPa: row.maxPa,
        doorOpenReadings: row.doorOpenReadings,
      }))
    : [];
  const series: PressurePoint[] = buckets.map((bucket) => ({
    at: bucket.at.toISOString(),
    readings: bucket.readings,
    meanPa: bucket.sumPa / bucket.readings,
    minPa: bucket.minPa,
    maxPa: bucket.maxPa,
    doorOpenReadings: bucket.doorOpenReadings,
  }));

  const { rows: alarmRows, total } = await repo.alarmsInRange(
    db,
    spaceId,
    bounds.from,
    now,
    maxListedAlarms,
  );
  const spans = await repo.excursionSpans(db, spaceId, bounds.from, now);
  const alarms: PressureAlarmEntry[] = alarmRows.map((row) => ({
    id: row.id,
    kind: row.kind,
    startedAt: row.startedAt.toISOString(),
    endedAt: row.endedAt?.toISOString() ?? null,
    durationMinutes:
      Math.round((((row.endedAt ?? now).getTime() - row.startedAt.getTime()) / minute) * 10) / 10,
    worst:
      row.worstValue !== null && row.worstUnit !== null && row.worstPa !== null && row.worstAt
        ? {
            value: row.worstValue,
            unit: row.worstUnit,
            pressurePa: row.worstPa,
            at: row.worstAt.toISOString(),
          }
        : null,
    critical: row.criticalAt !== null,
    acknowledgement: row.acknowledgedAt
      ? {
          at: row.acknowledgedAt.toISOString(),
          byName: row.acknowledgedByName,
          note: row.acknowledgementNote,
        }
      : null,
  }));

  return {
    space: {
      id: space.id,
      siteId: space.siteId,
      name: space.name,
      zoneType: space.zoneType,
      retired: space.retiredAt !== null,
      takesMonitor: takesMonitor(space.zoneType),
      timeZone: space.timeZone,
    },
    monitor,
    live,
    range,
    from: bounds.from.toISOString(),
    to: now.toISOString(),
    bucket: size,
    series,
    table: monitorRow ? tableRows(range, bounds, buckets, spans, space.timeZone) : [],
    alarms,
    alarmCount: total,
  };
}

/** Refuses a mapping a room cannot take. */
function assertMappable(space: NonNullable<Awaited<ReturnType<typeof repo.findSpace>>>) {
  if (space.retiredAt)
    throw conflict(
      `${space.name} is retired: its monitor no longer alarms. An administrator can restore the room first.`,
    );
  if (!takesMonitor(space.zoneType))
    throw conflict(
      "Only isolation rooms take a pressure monitor: the alarm judges the isolation room's differential to the corridor.",
      "monitorId",
    );
}

/**
 * Maps a monitor to the room, or changes the room's monitor id or threshold. A monitor id is one
 * room's only: mapped elsewhere, it is refused naming the field. Changing the id starts the alarm
 * job afresh for the new monitor.
 */
export async function mapMonitor(
  db: Database,
  spaceId: string,
  body: MonitorMappingBody,
  actor: Actor,
): Promise<PressureMonitor> {
  try {
    return await db.transaction(async (tx) => {
      const space = await repo.findSpace(tx, spaceId, { lock: true });
      if (!space) throw notFound("That space");
      assertMappable(space);
      const elsewhere = await repo.findMapping(tx, body.monitorId);
      if (elsewhere && elsewhere.spaceId !== spaceId) throw mappedElsewhere(elsewhere, space);
      const before = await repo.findMonitorOfSpace(tx, spaceId);
      const row = before
        ? await repo.updateMonitor(tx, before.id, {
            monitorId: body.monitorId,
            thresholdPa: body.thresholdPa,
            ...(before.monitorId !== body.monitorId ? { evaluatedThrough: null } : {}),
          })
        : await repo.insertMonitor(tx, {
            monitorId: body.monitorId,
            siteId: space.siteId,
            spaceId,
            thresholdPa: body.thresholdPa,
            createdBy: actor.userId,
          });
      await recordChange(tx, actor, {
        action: before ? "pressure-monitor.updated" : "pressure-monitor.mapped",
        entity: "space",
        entityId: spaceId,
        siteId: space.siteId,
        before: before ? repo.shownMonitor(before) : null,
        after: repo.shownMonitor(row),
      });
      const latest = await repo.latestReading(tx, row.monitorId, new Date());
      return toMonitor(row, latest?.unit ?? "Pa");
    });
  } catch (err) {
    // Two rooms mapped the same monitor at the same moment: the unique key decided.
    if (databaseCodeOf(err) === "23505") {
      const elsewhere = await repo.findMapping(db, body.monitorId);
      const space = await repo.findSpace(db, spaceId);
      if (elsewhere && space && elsewhere.spaceId !== spaceId)
        throw mappedElsewhere(elsewhere, space);
    }
    throw err;
  }
}

function mappedElsewhere(
  elsewhere: { siteId: string; spaceName: string },
  space: { siteId: string },
): AppError {
  // Another site's room is not named: the person may hold no role there.
  const where = elsewhere.siteId === space.siteId ? elsewhere.spaceName : "a room at another site";
  return conflict(
    `That monitor is already mapped to ${where}. Unmap it there first, or check the id.`,
    "monitorId",
  );
}

/**
 * Takes the monitor off the room (it moved, or the room no longer has one). Its open alarms end
 * now, quietly; the room's alarm log keeps every alarm, and the mapping history keeps the hours it
 * watched this room for the committee. The same id can then be mapped to another room.
 */
export async function unmapMonitor(db: Database, spaceId: string, actor: Actor): Promise<void> {
  await db.transaction(async (tx: DbOrTx) => {
    const space = await repo.findSpace(tx, spaceId, { lock: true });
    if (!space) throw notFound("That space");
    const before = await repo.findMonitorOfSpace(tx, spaceId);
    if (!before) throw notFound("A monitor on this room");
    await endAlarmsOfRetiredSpace(tx, before.id, new Date());
    await repo.deleteMonitor(tx, before.id);
    await recordChange(tx, actor, {
      action: "pressure-monitor.unmapped",
      entity: "space",
      entityId: spaceId,
      siteId: space.siteId,
      before: repo.shownMonitor(before),
      after: null,
    });
  });
}
