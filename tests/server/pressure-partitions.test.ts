import { randomUUID } from "node:crypto";

import { sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";

import type { PressureReading } from "@shared/schemas/pressure-readings";

import { runPartitionRound } from "../../server/modules/pressure/partitions.job";
import {
  ensureReadingPartitions,
  storeReadings,
} from "../../server/modules/pressure/readings.repository";
import { testApp } from "../helpers/app";
import { partitionJobYear } from "../helpers/made-up-dates";

const db = () => testApp().deps.db;

const reading = (monitorId: string, at: string, pressure: number): PressureReading => ({
  monitorId,
  measuredAt: new Date(at),
  pressure,
  unit: "Pa",
  door: null,
});

async function partitions(year: number) {
  const { rows } = await db().execute<{ name: string }>(sql`
    select child.relname as name from pg_inherits
    join pg_class parent on parent.oid = pg_inherits.inhparent
    join pg_class child on child.oid = pg_inherits.inhrelid
    where parent.relname = 'pressure_readings' and child.relname like ${`pressure_readings_${year}_%`}
    order by 1`);
  return rows.map((row) => row.name);
}

async function readingsOf(monitorId: string) {
  const { rows } = await db().execute<{ measured_at: string; partition: string }>(sql`
    select measured_at, tableoid::regclass::text as partition from pressure_readings
    where monitor_id = ${monitorId} order by measured_at`);
  return rows.map((row) => ({
    at: new Date(row.measured_at).toISOString(),
    partition: row.partition,
  }));
}

describe("the pressure partition job", () => {
  it("when a month is wholly older than the raw-reading limit, then its partition is dropped, later months and the DEFAULT partition's readings are kept, and the roll-ups stay", async () => {
    const year = partitionJobYear();
    const monitor = `part-${randomUUID().slice(0, 8)}`;
    await ensureReadingPartitions(db(), new Date(Date.UTC(year, 0, 1)), 2);
    const now = new Date(Date.UTC(year, 5, 15));
    await storeReadings(
      db(),
      [
        // No partition for the December before: it waits in the DEFAULT partition.
        reading(monitor, `${year - 1}-12-20T08:00:00Z`, -4),
        reading(monitor, `${year}-01-10T08:00:00Z`, -5),
        reading(monitor, `${year}-02-27T23:59:59Z`, -6),
        reading(monitor, `${year}-03-01T00:00:00Z`, -7),
      ],
      { source: "upload", now },
    );
    expect((await readingsOf(monitor)).map((row) => row.partition)).toEqual([
      "pressure_readings_default",
      `pressure_readings_${year}_01`,
      `pressure_readings_${year}_02`,
      `pressure_readings_${year}_03`,
    ]);

    // 90 days before 15 June is 17 March: January and February are wholly older, March is not.
    const round = await runPartitionRound(db(), now, 90);

    // (Earlier years' leftovers in a reused test database may go too; this year's are the test.)
    expect(round.dropped.filter((name) => name.includes(`_${year}_`))).toEqual([
      `pressure_readings_${year}_01`,
      `pressure_readings_${year}_02`,
    ]);
    expect(round.ensured).toEqual([
      `pressure_readings_${year}_06`,
      `pressure_readings_${year}_07`,
      `pressure_readings_${year}_08`,
    ]);
    expect(await partitions(year)).toEqual([
      `pressure_readings_${year}_03`,
      `pressure_readings_${year}_06`,
      `pressure_readings_${year}_07`,
      `pressure_readings_${year}_08`,
    ]);
    expect(await readingsOf(monitor)).toEqual([
      { at: `${year - 1}-12-20T08:00:00.000Z`, partition: "pressure_readings_default" },
      { at: `${year}-03-01T00:00:00.000Z`, partition: `pressure_readings_${year}_03` },
    ]);
    const { rows: hours } = await db().execute<{ bucket_start: string; sum_pa: number }>(
      sql`select bucket_start, sum_pa from pressure_hours where monitor_id = ${monitor} order by bucket_start`,
    );
    expect(hours.map((row) => row.sum_pa)).toEqual([-4, -5, -6, -7]);

    // A second round the same day has nothing more to drop.
    expect((await runPartitionRound(db(), now, 90)).dropped).toEqual([]);
  });
});
