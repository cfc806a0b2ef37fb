import { sql } from "drizzle-orm";

import type { DoorState, PressureUnit } from "@shared/schemas/pressure-readings";
import type { ZoneType } from "@shared/zones";

import type { DbOrTx } from "../../db/client";

/** A mapped monitor in a room still in use, with its newest stored reading (if any). */
export interface MonitoredRoomRow {
  monitorRowId: string;
  monitorId: string;
  thresholdPa: number | null;
  spaceId: string;
  spaceName: string;
  zoneType: ZoneType;
  floorId: string;
  floorName: string;
  latest: {
    measuredAt: Date;
    pressure: number;
    unit: PressureUnit;
    pressurePa: number;
    door: DoorState | null;
  } | null;
}

/**
 * The site's monitored rooms and each monitor's newest reading. The newest reading is one
 * LATERAL probe per monitor on the readings' unique key (monitor_id, measured_at), read backwards
 * in every month's partition and stopped after one row, so it costs a few index pages per room
 * however long the history (tests/server/pressure-now.test.ts checks the plan).
 */
export const monitoredRoomsQuery = (siteId: string) => sql`
  select m.id as monitor_row_id, m.monitor_id, m.threshold_pa,
    s.id as space_id, s.name as space_name, s.zone_type, f.id as floor_id, f.name as floor_name,
    r.measured_at, r.pressure, r.unit, r.pressure_pa, r.door
  from pressure_monitors m
  join spaces s on s.id = m.space_id and s.retired_at is null
  join floors f on f.id = s.floor_id and f.retired_at is null
  left join lateral (
    select measured_at, pressure, unit, pressure_pa, door
    from pressure_readings pr
    where pr.monitor_id = m.monitor_id
    order by pr.measured_at desc
    limit 1
  ) r on true
  where m.site_id = ${siteId}
  order by f.level, f.name, s.name`;

export async function monitoredRooms(db: DbOrTx, siteId: string): Promise<MonitoredRoomRow[]> {
  const result = await db.execute<{
    monitor_row_id: string;
    monitor_id: string;
    threshold_pa: number | null;
    space_id: string;
    space_name: string;
    zone_type: ZoneType;
    floor_id: string;
    floor_name: string;
    measured_at: string | null;
    pressure: number | null;
    unit: PressureUnit | null;
    pressure_pa: number | null;
    door: DoorState | null;
  }>(monitoredRoomsQuery(siteId));
  return result.rows.map((row) => ({
    monitorRowId: row.monitor_row_id,
    monitorId: row.monitor_id,
    thresholdPa: row.threshold_pa,
    spaceId: row.space_id,
    spaceName: row.space_name,
    zoneType: row.zone_type,
    floorId: row.floor_id,
    floorName: row.floor_name,
    latest:
      row.measured_at === null
        ? null
        : {
            measuredAt: new Date(row.measured_at),
            pressure: row.pressure!,
            unit: row.unit!,
            pressurePa: row.pressure_pa!,
            door: row.door,
          },
  }));
}

export interface AlarmRow {
  id: string;
  monitorRowId: string;
  siteId: string;
  spaceId: string;
  kind: "out_of_range" | "no_readings";
  startedAt: Date;
  alarmAt: Date;
  endedAt: Date | null;
  worstValue: number | null;
  worstUnit: PressureUnit | null;
  worstPa: number | null;
  criticalAt: Date | null;
  acknowledgedAt: Date | null;
  acknowledgedByName: string | null;
  acknowledgementNote: string | null;
}

type RawAlarmRow = {
  id: string;
  monitor_row_id: string;
  site_id: string;
  space_id: string;
  kind: "out_of_range" | "no_readings";
  started_at: string;
  alarm_at: string;
  ended_at: string | null;
  worst_value: number | null;
  worst_unit: PressureUnit | null;
  worst_pa: number | null;
  critical_at: string | null;
  acknowledged_at: string | null;
  acknowledged_by_name: string | null;
  acknowledgement_note: string | null;
};

const date = (value: string | null) => (value === null ? null : new Date(value));

function alarmFromRow(row: RawAlarmRow): AlarmRow {
  return {
    id: row.id,
    monitorRowId: row.monitor_row_id,
    siteId: row.site_id,
    spaceId: row.space_id,
    kind: row.kind,
    startedAt: new Date(row.started_at),
    alarmAt: new Date(row.alarm_at),
    endedAt: date(row.ended_at),
    worstValue: row.worst_value,
    worstUnit: row.worst_unit,
    worstPa: row.worst_pa,
    criticalAt: date(row.critical_at),
    acknowledgedAt: date(row.acknowledged_at),
    acknowledgedByName: row.acknowledged_by_name,
    acknowledgementNote: row.acknowledgement_note,
  };
}

const alarmColumns = sql`a.id, a.monitor_row_id, a.site_id, a.space_id, a.kind, a.started_at,
  a.alarm_at, a.ended_at, a.worst_value, a.worst_unit, a.worst_pa, a.critical_at,
  a.acknowledged_at, u.display_name as acknowledged_by_name, a.acknowledgement_note`;

/** The site's open alarms (`pressure_alarms_site_open_idx`), oldest first. */
export async function openAlarmsOfSite(db: DbOrTx, siteId: string): Promise<AlarmRow[]> {
  const result = await db.execute<RawAlarmRow>(sql`
    select ${alarmColumns}
    from pressure_alarms a
    left join users u on u.id = a.acknowledged_by
    where a.site_id = ${siteId} and a.ended_at is null
    order by a.started_at`);
  return result.rows.map(alarmFromRow);
}

export async function siteOfAlarm(db: DbOrTx, alarmId: string): Promise<string | null> {
  const result = await db.execute<{ site_id: string }>(
    sql`select site_id from pressure_alarms where id = ${alarmId}`,
  );
  return result.rows[0]?.site_id ?? null;
}

/** The alarm, its row locked until the transaction ends. */
export async function lockAlarm(db: DbOrTx, alarmId: string): Promise<AlarmRow | null> {
  const result = await db.execute<RawAlarmRow>(sql`
    select ${alarmColumns}
    from pressure_alarms a
    left join users u on u.id = a.acknowledged_by
    where a.id = ${alarmId}
    for update of a`);
  const row = result.rows[0];
  return row ? alarmFromRow(row) : null;
}

export async function acknowledgeAlarm(
  db: DbOrTx,
  alarmId: string,
  input: { userId: string; note: string; at: Date },
): Promise<AlarmRow> {
  await db.execute(sql`
    update pressure_alarms
    set acknowledged_at = ${input.at.toISOString()}, acknowledged_by = ${input.userId},
      acknowledgement_note = ${input.note}, updated_at = now()
    where id = ${alarmId}`);
  return (await lockAlarm(db, alarmId))!;
}

export async function siteOfSpace(db: DbOrTx, spaceId: string): Promise<string | null> {
  const result = await db.execute<{ site_id: string }>(
    sql`select site_id from spaces where id = ${spaceId}`,
  );
  return result.rows[0]?.site_id ?? null;
}

export async function monitorOfSpace(
  db: DbOrTx,
  spaceId: string,
): Promise<{ monitorId: string; thresholdPa: number | null } | null> {
  const result = await db.execute<{ monitor_id: string; threshold_pa: number | null }>(
    sql`select monitor_id, threshold_pa from pressure_monitors where space_id = ${spaceId}`,
  );
  const row = result.rows[0];
  return row ? { monitorId: row.monitor_id, thresholdPa: row.threshold_pa } : null;
}

/** One room's minutes from the minute roll-up (its primary key is monitor and minute). */
export async function minutesOf(
  db: DbOrTx,
  monitorId: string,
  from: Date,
  to: Date,
): Promise<{ at: Date; readings: number; sumPa: number; minPa: number; maxPa: number }[]> {
  const result = await db.execute<{
    bucket_start: string;
    readings: number;
    sum_pa: number;
    min_pa: number;
    max_pa: number;
  }>(sql`
    select bucket_start, readings, sum_pa, min_pa, max_pa
    from pressure_minutes
    where monitor_id = ${monitorId} and bucket_start >= ${from.toISOString()}
      and bucket_start <= ${to.toISOString()}
    order by bucket_start`);
  return result.rows.map((row) => ({
    at: new Date(row.bucket_start),
    readings: Number(row.readings),
    sumPa: Number(row.sum_pa),
    minPa: Number(row.min_pa),
    maxPa: Number(row.max_pa),
  }));
}

export async function siteName(db: DbOrTx, siteId: string): Promise<string> {
  const result = await db.execute<{ name: string }>(
    sql`select name from sites where id = ${siteId}`,
  );
  return result.rows[0]?.name ?? "";
}
