import { randomUUID } from "node:crypto";

import { sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";

import type { PressureReading } from "@shared/schemas/pressure-readings";

import {
  ensureReadingPartitions,
  storeReadings,
} from "../../server/modules/pressure/readings.repository";
import { testApp } from "../helpers/app";
import { storageMonth } from "../helpers/made-up-dates";

const db = () => testApp().deps.db;

function reading(
  monitorId: string,
  at: string,
  pressure: number,
  door: "open" | "closed" | null = null,
): PressureReading {
  return { monitorId, measuredAt: new Date(at), pressure, unit: "Pa", door };
}

async function rows(monitorId: string) {
  const result = await db().execute<{
    measured_at: string;
    pressure_pa: number;
    door: string | null;
  }>(
    sql`select measured_at, pressure_pa, door from pressure_readings where monitor_id = ${monitorId} order by measured_at`,
  );
  return result.rows.map((row) => ({
    at: new Date(row.measured_at).toISOString(),
    pa: row.pressure_pa,
    door: row.door,
  }));
}

async function rollUp(table: "pressure_minutes" | "pressure_hours", monitorId: string) {
  const result = await db().execute<{
    bucket_start: string;
    readings: number;
    sum_pa: number;
    min_pa: number;
    max_pa: number;
    door_open_readings: number;
    minutes_with_readings?: number;
  }>(
    sql`select bucket_start, readings, sum_pa, min_pa, max_pa, door_open_readings${table === "pressure_hours" ? sql`, minutes_with_readings` : sql``} from ${sql.identifier(table)} where monitor_id = ${monitorId} order by bucket_start`,
  );
  return result.rows.map((row) => ({
    ...row,
    bucket_start: new Date(row.bucket_start).toISOString(),
  }));
}

const now = new Date("2026-12-03T10:00:00Z");

describe("storing room-pressure readings", () => {
  it("when readings arrive twice and out of order, then each is stored once, in time order, and the roll-ups count it once", async () => {
    const monitor = `store-${randomUUID().slice(0, 8)}`;
    const first = [
      reading(monitor, "2026-12-03T09:00:10Z", -5, "closed"),
      reading(monitor, "2026-12-03T09:00:00Z", -4),
      reading(monitor, "2026-12-03T09:00:10Z", -99), // repeated inside the batch: the first wins
    ];
    const outcome = await storeReadings(db(), first, { source: "mqtt", now });
    expect(outcome).toMatchObject({ stored: 2, duplicates: 1, future: [] });

    const again = await storeReadings(
      db(),
      [
        reading(monitor, "2026-12-03T09:00:00Z", -4),
        reading(monitor, "2026-12-03T09:01:30Z", -3, "open"),
      ],
      { source: "mqtt", now },
    );
    expect(again).toMatchObject({ stored: 1, duplicates: 1 });

    expect(await rows(monitor)).toEqual([
      { at: "2026-12-03T09:00:00.000Z", pa: -4, door: null },
      { at: "2026-12-03T09:00:10.000Z", pa: -5, door: "closed" },
      { at: "2026-12-03T09:01:30.000Z", pa: -3, door: "open" },
    ]);
    expect(await rollUp("pressure_minutes", monitor)).toEqual([
      {
        bucket_start: "2026-12-03T09:00:00.000Z",
        readings: 2,
        sum_pa: -9,
        min_pa: -5,
        max_pa: -4,
        door_open_readings: 0,
      },
      {
        bucket_start: "2026-12-03T09:01:00.000Z",
        readings: 1,
        sum_pa: -3,
        min_pa: -3,
        max_pa: -3,
        door_open_readings: 1,
      },
    ]);
    expect(await rollUp("pressure_hours", monitor)).toEqual([
      {
        bucket_start: "2026-12-03T09:00:00.000Z",
        readings: 3,
        sum_pa: -12,
        min_pa: -5,
        max_pa: -3,
        door_open_readings: 1,
        // 09:00 and 09:01 each had a reading; the redelivery added no minute.
        minutes_with_readings: 2,
      },
    ]);
  });

  it("when a reading is in inches of water, then it is kept as sent and in Pa", async () => {
    const monitor = `inch-${randomUUID().slice(0, 8)}`;
    await storeReadings(
      db(),
      [
        {
          monitorId: monitor,
          measuredAt: new Date("2026-12-03T09:00:00Z"),
          pressure: -0.01,
          unit: "inH2O",
          door: null,
        },
      ],
      { source: "upload", now },
    );
    const result = await db().execute<{ pressure: number; unit: string; pressure_pa: number }>(
      sql`select pressure, unit, pressure_pa from pressure_readings where monitor_id = ${monitor}`,
    );
    // 1 in. w.c. = 249.0889 Pa (NIST SP 811, conventional inch of water at 4 °C, rounded).
    expect(result.rows[0]).toMatchObject({ pressure: -0.01, unit: "inH2O" });
    expect(result.rows[0]!.pressure_pa).toBeCloseTo(-2.490889, 4);
  });

  it("when a reading is dated more than a minute ahead, then it is refused and counted, and the rest are stored", async () => {
    const monitor = `future-${randomUUID().slice(0, 8)}`;
    const before = await tallyOf("upload", "future");
    const outcome = await storeReadings(
      db(),
      [
        reading(monitor, "2026-12-03T10:00:59Z", -5), // within the skew
        reading(monitor, "2026-12-03T10:01:01Z", -5), // beyond it
      ],
      { source: "upload", now },
    );
    expect(outcome.stored).toBe(1);
    expect(outcome.future.map((r) => r.measuredAt.toISOString())).toEqual([
      "2026-12-03T10:01:01.000Z",
    ]);
    expect(await tallyOf("upload", "future")).toBe(before + 1);
    expect((await rows(monitor)).map((r) => r.at)).toEqual(["2026-12-03T10:00:59.000Z"]);
  });

  it("when a reading falls in a month with no partition yet, then the default partition keeps it and the partition job moves it into its month", async () => {
    const monitor = `far-${randomUUID().slice(0, 8)}`;
    // A month long past, away from the partitions the migration makes ahead of today.
    const month = storageMonth();
    await storeReadings(db(), [reading(monitor, month.toISOString(), -6)], {
      source: "upload",
      now,
    });
    expect(await partitionOf(monitor)).toBe("pressure_readings_default");

    const [name] = await ensureReadingPartitions(db(), month, 0);
    expect(name).toBe(
      `pressure_readings_${month.toISOString().slice(0, 4)}_${month.toISOString().slice(5, 7)}`,
    );
    expect(await partitionOf(monitor)).toBe(name);
    // Made again: nothing changes.
    expect(await ensureReadingPartitions(db(), month, 0)).toEqual([name]);
    expect(await rows(monitor)).toHaveLength(1);
  });

  it("when the migrations have run, then the readings table is partitioned by month on its time, with a default partition and a BRIN index", async () => {
    const result = await db().execute<{ strategy: string; key: string }>(sql`
      select p.partstrat as strategy, pg_get_partkeydef('pressure_readings'::regclass) as key
      from pg_partitioned_table p where p.partrelid = 'pressure_readings'::regclass`);
    expect(result.rows[0]).toEqual({ strategy: "r", key: "RANGE (measured_at)" });
    const brin = await db().execute<{ method: string }>(sql`
      select am.amname as method from pg_class c join pg_am am on am.oid = c.relam
      where c.relname = 'pressure_readings_time_brin'`);
    expect(brin.rows[0]?.method).toBe("brin");
    const current = `pressure_readings_${new Date().toISOString().slice(0, 4)}_${new Date().toISOString().slice(5, 7)}`;
    const parts = await db().execute<{ name: string }>(sql`
      select c.relname as name from pg_inherits i join pg_class c on c.oid = i.inhrelid
      where i.inhparent = 'pressure_readings'::regclass`);
    expect(parts.rows.map((r) => r.name)).toEqual(
      expect.arrayContaining(["pressure_readings_default", current]),
    );
  });
});

async function tallyOf(source: string, outcome: string): Promise<number> {
  const result = await db().execute<{ count: number }>(
    sql`select coalesce(sum(count), 0)::int as count from pressure_ingest_tallies where source = ${source} and outcome = ${outcome}`,
  );
  return result.rows[0]!.count;
}

async function partitionOf(monitorId: string): Promise<string> {
  const result = await db().execute<{ name: string }>(
    sql`select tableoid::regclass::text as name from pressure_readings where monitor_id = ${monitorId}`,
  );
  return result.rows[0]!.name;
}
