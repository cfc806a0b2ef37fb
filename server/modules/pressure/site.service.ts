import { defaultExcursionPolicy, readingInRange } from "@shared/calc/pressure-excursions";
import type { Threshold } from "@shared/calc/answer-rules";
import type {
  AcknowledgeAlarmBody,
  Pressure24hResponse,
  PressureNowResponse,
  PressureOpenAlarm,
  PressureRoomState,
} from "@shared/schemas/pressure-site";

import type { Database } from "../../db/client";
import { AppError, notFound } from "../../lib/app-error";
import { recordChange } from "../../lib/change-log";
import type { RequestActor } from "../../lib/context";
import * as repo from "./site.repository";

export const siteOfAlarm = (db: Database, alarmId: string) => repo.siteOfAlarm(db, alarmId);
export const siteOfSpace = (db: Database, spaceId: string) => repo.siteOfSpace(db, spaceId);

/** The room's threshold: its own figure in Pa, or Lintel's default (CDC, −2.5 Pa / −0.01 in. w.c.). */
export function thresholdOf(thresholdPa: number | null): Threshold {
  return thresholdPa === null ? defaultExcursionPolicy.threshold : { op: "<=", value: thresholdPa };
}

/**
 * A room's state now, from its open alarms (the alarm job's decisions) and its newest reading.
 * An open excursion outranks a silence. A monitor silent past the limit shows "no readings" even
 * before the alarm job has written the alarm, so the phone never shows a stale "negative".
 */
export function roomState(input: {
  openKinds: ReadonlySet<"out_of_range" | "no_readings">;
  latest: repo.MonitoredRoomRow["latest"];
  threshold: Threshold;
  now: Date;
  silenceMs?: number;
}): PressureRoomState {
  if (input.openKinds.has("out_of_range")) return "excursion";
  if (input.openKinds.has("no_readings")) return "no_readings";
  if (input.latest === null) return "never_reported";
  const silenceMs = input.silenceMs ?? defaultExcursionPolicy.silenceMs;
  if (input.now.getTime() - input.latest.measuredAt.getTime() >= silenceMs) return "no_readings";
  return readingInRange({ monitorId: "", ...input.latest }, input.threshold)
    ? "in_range"
    : "out_of_range";
}

function alarmView(alarm: repo.AlarmRow): PressureOpenAlarm {
  return {
    id: alarm.id,
    kind: alarm.kind,
    since: alarm.startedAt.toISOString(),
    alarmAt: alarm.alarmAt.toISOString(),
    worstValue: alarm.worstValue,
    worstUnit: alarm.worstUnit,
    worstPa: alarm.worstPa,
    critical: alarm.criticalAt !== null,
    acknowledgedAt: alarm.acknowledgedAt?.toISOString() ?? null,
    acknowledgedByName: alarm.acknowledgedByName,
    acknowledgementNote: alarm.acknowledgementNote,
  };
}

/** Every monitored room of the site, its state now and the alarm behind it. */
export async function pressureNow(
  db: Database,
  siteId: string,
  now: Date = new Date(),
): Promise<PressureNowResponse> {
  const [rooms, alarms, name] = await Promise.all([
    repo.monitoredRooms(db, siteId),
    repo.openAlarmsOfSite(db, siteId),
    repo.siteName(db, siteId),
  ]);
  const byMonitor = new Map<string, repo.AlarmRow[]>();
  for (const alarm of alarms) {
    const list = byMonitor.get(alarm.monitorRowId) ?? [];
    list.push(alarm);
    byMonitor.set(alarm.monitorRowId, list);
  }
  return {
    siteId,
    siteName: name,
    asOf: now.toISOString(),
    rooms: rooms.map((room) => {
      const open = byMonitor.get(room.monitorRowId) ?? [];
      const threshold = thresholdOf(room.thresholdPa);
      const state = roomState({
        openKinds: new Set(open.map((alarm) => alarm.kind)),
        latest: room.latest,
        threshold,
        now,
      });
      const alarm =
        open.find((a) => a.kind === "out_of_range") ??
        open.find((a) => a.kind === "no_readings") ??
        null;
      return {
        spaceId: room.spaceId,
        spaceName: room.spaceName,
        zoneType: room.zoneType,
        floorId: room.floorId,
        floorName: room.floorName,
        monitorId: room.monitorId,
        thresholdPa: threshold.value,
        state,
        latest: room.latest && {
          measuredAt: room.latest.measuredAt.toISOString(),
          pressure: room.latest.pressure,
          unit: room.latest.unit,
          pressurePa: room.latest.pressurePa,
          door: room.latest.door,
        },
        alarm: alarm && alarmView(alarm),
      };
    }),
  };
}

/**
 * Someone has seen the alarm and says what they did: kept with the alarm and in the change log.
 * An alarm is acknowledged once; a second acknowledgement (another person, or a replay) is a 409
 * naming who acknowledged it first.
 */
export async function acknowledgeAlarm(
  db: Database,
  alarmId: string,
  body: AcknowledgeAlarmBody,
  actor: RequestActor,
  now: Date = new Date(),
): Promise<PressureOpenAlarm> {
  return db.transaction(async (tx) => {
    const alarm = await repo.lockAlarm(tx, alarmId);
    if (alarm === null) throw notFound("That alarm");
    if (alarm.acknowledgedAt !== null) {
      throw new AppError(
        "conflict",
        409,
        `This alarm was already acknowledged${alarm.acknowledgedByName ? ` by ${alarm.acknowledgedByName}` : ""} at ${alarm.acknowledgedAt.toISOString()}.`,
      );
    }
    const updated = await repo.acknowledgeAlarm(tx, alarmId, {
      userId: actor.userId,
      note: body.note,
      at: now,
    });
    await recordChange(tx, actor, {
      action: "pressure_alarm.acknowledged",
      entity: "pressure_alarm",
      entityId: alarmId,
      siteId: alarm.siteId,
      before: { acknowledgedAt: null },
      after: { acknowledgedAt: now.toISOString(), kind: alarm.kind },
      reason: body.note,
    });
    return alarmView(updated);
  });
}

const dayMs = 24 * 60 * 60 * 1000;

/** The room's last 24 hours from the minute roll-up, with min, mean, max and minutes out of range. */
export async function pressure24h(
  db: Database,
  spaceId: string,
  now: Date = new Date(),
): Promise<Pressure24hResponse> {
  const from = new Date(now.getTime() - dayMs);
  const monitor = await repo.monitorOfSpace(db, spaceId);
  const threshold = thresholdOf(monitor?.thresholdPa ?? null);
  const base = {
    spaceId,
    monitorId: monitor?.monitorId ?? null,
    thresholdPa: threshold.value,
    from: from.toISOString(),
    to: now.toISOString(),
  };
  if (monitor === null) return { ...base, points: [], summary: null };
  const minutes = await repo.minutesOf(db, monitor.monitorId, from, now);
  if (minutes.length === 0) return { ...base, points: [], summary: null };
  let readings = 0;
  let sum = 0;
  let minPa = Infinity;
  let maxPa = -Infinity;
  let outOfRange = 0;
  for (const minute of minutes) {
    readings += minute.readings;
    sum += minute.sumPa;
    minPa = Math.min(minPa, minute.minPa);
    maxPa = Math.max(maxPa, minute.maxPa);
    // A minute with any reading on the wrong side of the threshold counts as out of range.
    const worst = threshold.op === "<=" ? minute.maxPa : minute.minPa;
    const ok = threshold.op === "<=" ? worst <= threshold.value : worst >= threshold.value;
    if (!ok) outOfRange += 1;
  }
  return {
    ...base,
    points: minutes.map((minute) => ({
      at: minute.at.toISOString(),
      meanPa: minute.sumPa / minute.readings,
      minPa: minute.minPa,
      maxPa: minute.maxPa,
    })),
    summary: {
      minPa,
      meanPa: sum / readings,
      maxPa,
      minutes: minutes.length,
      minutesOutOfRange: outOfRange,
    },
  };
}
