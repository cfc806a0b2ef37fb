import { sql } from "drizzle-orm";

import {
  futureReadingProblem,
  pressureInPascals,
  type PressureReading,
} from "@shared/schemas/pressure-readings";

import type { DbOrTx } from "../../db/client";

/** Where readings came from, for the tallies. */
export type ReadingSource = "mqtt" | "upload";

/** What storing a batch did. Readings are stored once whatever order or how often they arrive. */
export interface StoreOutcome {
  /** Rows actually inserted (new monitor and time). */
  stored: number;
  /** Already stored (a redelivery), or repeated inside the batch: kept once. */
  duplicates: number;
  /** Dated beyond the allowed clock skew ahead of `now`: refused, counted, not stored. */
  future: PressureReading[];
  /** The inserted readings, in time order per monitor: what the alarm job has to look at. */
  inserted: { monitorId: string; measuredAt: Date }[];
}

/**
 * Stores readings idempotently, in one statement: the raw rows (unique on monitor and time, the
 * first received wins) and, from exactly the rows inserted, the one-minute and one-hour roll-ups
 * (the hour also counts its minutes that had a reading: the minute rows this statement created).
 * A redelivered reading inserts nothing and so changes no roll-up. Readings dated more than the
 * allowed skew ahead of `now` are refused and counted.
 */
export async function storeReadings(
  db: DbOrTx,
  readings: readonly PressureReading[],
  options: { source: ReadingSource; now: Date },
): Promise<StoreOutcome> {
  const future: PressureReading[] = [];
  const accepted: PressureReading[] = [];
  for (const reading of readings) {
    if (futureReadingProblem(reading.measuredAt, options.now)) future.push(reading);
    else accepted.push(reading);
  }
  let inserted: { monitorId: string; measuredAt: Date }[] = [];
  if (accepted.length > 0) {
    const monitorIds = accepted.map((r) => r.monitorId);
    const times = accepted.map((r) => r.measuredAt.toISOString());
    const pressures = accepted.map((r) => r.pressure);
    const units = accepted.map((r) => r.unit);
    const pascals = accepted.map((r) => pressureInPascals(r));
    const doors = accepted.map((r) => r.door);
    const result = await db.execute<{ monitor_id: string; measured_at: string }>(sql`
      with incoming as (
        select distinct on (monitor_id, measured_at) monitor_id, measured_at, pressure, unit, pressure_pa, door
        from unnest(
          ${sql.param(monitorIds)}::varchar[], ${sql.param(times)}::timestamptz[],
          ${sql.param(pressures)}::float8[], ${sql.param(units)}::pressure_unit[],
          ${sql.param(pascals)}::float8[], ${sql.param(doors)}::door_state[]
        ) with ordinality as t(monitor_id, measured_at, pressure, unit, pressure_pa, door, n)
        order by monitor_id, measured_at, n
      ),
      inserted as (
        insert into pressure_readings (monitor_id, measured_at, pressure, unit, pressure_pa, door)
        select monitor_id, measured_at, pressure, unit, pressure_pa, door from incoming
        on conflict (monitor_id, measured_at) do nothing
        returning monitor_id, measured_at, pressure_pa, door
      ),
      minutes as (
        insert into pressure_minutes (monitor_id, bucket_start, readings, sum_pa, min_pa, max_pa, door_open_readings)
        select monitor_id, date_trunc('minute', measured_at, 'UTC'), count(*), sum(pressure_pa),
          min(pressure_pa), max(pressure_pa), count(*) filter (where door = 'open')
        from inserted group by 1, 2 order by 1, 2
        on conflict (monitor_id, bucket_start) do update set
          readings = pressure_minutes.readings + excluded.readings,
          sum_pa = pressure_minutes.sum_pa + excluded.sum_pa,
          min_pa = least(pressure_minutes.min_pa, excluded.min_pa),
          max_pa = greatest(pressure_minutes.max_pa, excluded.max_pa),
          door_open_readings = pressure_minutes.door_open_readings + excluded.door_open_readings
        returning monitor_id, bucket_start, (xmax = 0) as created
      ),
      new_minutes as (
        select monitor_id, date_trunc('hour', bucket_start, 'UTC') as bucket_start,
               count(*) filter (where created)::int as created
        from minutes group by 1, 2
      ),
      hours as (
        insert into pressure_hours (monitor_id, bucket_start, readings, sum_pa, min_pa, max_pa, door_open_readings, minutes_with_readings)
        select h.monitor_id, h.bucket_start, h.readings, h.sum_pa, h.min_pa, h.max_pa, h.door_open_readings,
               coalesce(n.created, 0)
        from (
          select monitor_id, date_trunc('hour', measured_at, 'UTC') as bucket_start, count(*) as readings,
            sum(pressure_pa) as sum_pa, min(pressure_pa) as min_pa, max(pressure_pa) as max_pa,
            count(*) filter (where door = 'open') as door_open_readings
          from inserted group by 1, 2
        ) h
        left join new_minutes n using (monitor_id, bucket_start)
        order by 1, 2
        on conflict (monitor_id, bucket_start) do update set
          minutes_with_readings = pressure_hours.minutes_with_readings + excluded.minutes_with_readings,
          readings = pressure_hours.readings + excluded.readings,
          sum_pa = pressure_hours.sum_pa + excluded.sum_pa,
          min_pa = least(pressure_hours.min_pa, excluded.min_pa),
          max_pa = greatest(pressure_hours.max_pa, excluded.max_pa),
          door_open_readings = pressure_hours.door_open_readings + excluded.door_open_readings
      )
      select monitor_id, measured_at from inserted order by monitor_id, measured_at`);
    inserted = result.rows.map((row) => ({
      monitorId: row.monitor_id,
      measuredAt: new Date(row.measured_at),
    }));
  }
  const duplicates = accepted.length - inserted.length;
  await tally(db, options, {
    stored: inserted.length,
    duplicate: duplicates,
    future: future.length,
  });
  return { stored: inserted.length, duplicates, future, inserted };
}

/** Adds to the day's counts of what ingestion did; outcomes with nothing to add are skipped. */
export async function tally(
  db: DbOrTx,
  options: { source: ReadingSource; now: Date },
  counts: Partial<Record<"stored" | "duplicate" | "future" | "invalid" | "wrong_site", number>>,
): Promise<void> {
  const entries = Object.entries(counts).filter(([, count]) => (count ?? 0) > 0);
  if (entries.length === 0) return;
  const day = options.now.toISOString().slice(0, 10);
  await db.execute(sql`
    insert into pressure_ingest_tallies (day, source, outcome, count)
    values ${sql.join(
      entries.map(([outcome, count]) => sql`(${day}, ${options.source}, ${outcome}, ${count})`),
      sql`, `,
    )}
    on conflict (day, source, outcome) do update set count = pressure_ingest_tallies.count + excluded.count`);
}

/** Makes the monthly partitions from `from` through `months` months ahead (the partition job). */
export async function ensureReadingPartitions(
  db: DbOrTx,
  from: Date,
  months: number,
): Promise<string[]> {
  const names: string[] = [];
  for (let ahead = 0; ahead <= months; ahead += 1) {
    const month = new Date(Date.UTC(from.getUTCFullYear(), from.getUTCMonth() + ahead, 1));
    const result = await db.execute<{ name: string }>(
      sql`select lintel_pressure_partition(${month.toISOString()}::timestamptz) as name`,
    );
    names.push(result.rows[0]!.name);
  }
  return names;
}
