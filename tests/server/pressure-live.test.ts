import { randomInt, randomUUID } from "node:crypto";

import { and, asc, eq, inArray, sql } from "drizzle-orm";
import mqtt, { type MqttClient } from "mqtt";
import { afterAll, beforeAll, describe, expect, it } from "vitest";

import { pressureTopic } from "@shared/schemas/pressure-readings";

import { correctiveActions, outbox, pressureAlarms } from "../../server/db/schema/index";
import { createLogger } from "../../server/lib/logger";
import { alarmRoundsSettled, createOnStored } from "../../server/modules/pressure/ingest.hook";
import { createPressureIngest } from "../../server/modules/pressure/ingest.service";
import { startMqttBroker, type MqttBroker } from "../../scripts/lib/mqtt-broker";
import { insertMonitoredRoom } from "../factories/pressure-h2";
import { testApp } from "../helpers/app";
import { testEnv } from "../helpers/test-env";

/**
 * The whole path, as a building would drive it: a monitor publishes to the real broker on
 * loopback, the ingest stores what arrives, and the alarm job started by the ingest's hook raises,
 * mails and ends the excursion and opens the corrective action.
 */
const db = () => testApp().deps.db;
const logger = createLogger("silent");
const minute = 60_000;

let broker: MqttBroker;
let monitor: MqttClient;
beforeAll(async () => {
  broker = await startMqttBroker();
  monitor = await mqtt.connectAsync(broker.url, { clientId: `monitor-${randomUUID()}` });
});
afterAll(async () => {
  await monitor?.endAsync();
  await broker?.stop();
});

async function until<T>(read: () => Promise<T>, done: (value: T) => boolean, what: string) {
  const end = Date.now() + 30_000;
  for (;;) {
    const value = await read();
    if (done(value)) return value;
    if (Date.now() > end) throw new Error(`timed out waiting for ${what}`);
    await new Promise((resolve) => setTimeout(resolve, 100));
  }
}

describe("live room pressure from the broker to the alarm", () => {
  it("when a monitor publishes a 20-minute timeline with duplicates and messages out of order, then one excursion, one start and one end e-mail each, one corrective action, and roll-ups equal to the raw averages", async () => {
    // The readings' own times decide. The ingest's clock (which the alarm rounds it starts use)
    // follows the timeline as it is sent, as if the 20 minutes passed in the few seconds it takes.
    const start = new Date(Math.floor(Date.now() / minute) * minute - 30 * minute);
    let clock = start;
    const room = await insertMonitoredRoom(db(), {
      mappedAt: new Date(start.getTime() - minute),
      settings: { actionLimitMinutes: 10 },
    });
    const ingest = createPressureIngest({
      db: db(),
      databaseUrl: testEnv().DATABASE_URL,
      logger,
      mqtt: {
        url: broker.url,
        rejectUnauthorized: true,
        clientId: `lintel-${randomUUID()}`,
        topicPrefix: "lintel/pressure",
      },
      now: () => clock,
      lockKey: BigInt(randomInt(1, 2 ** 40)),
      lockRetryMs: 150,
      onStored: createOnStored({ ...testApp().deps, env: testEnv(), notifyOutbox: () => {} }),
    });
    try {
      await ingest.start();
      await until(
        async () => ingest.state(),
        (state) => state === "ingesting",
        "the lock",
      );

      // Every 10 s for 20 minutes: −6 Pa, out of range (+1.5 Pa, worst +2.0 Pa at 10:00) from
      // minute 4 to minute 16 (12 minutes, past the action limit of 10), then back to −6 Pa.
      const pressureAt = (s: number) =>
        s >= 4 * 60 && s < 16 * 60 ? (s === 10 * 60 ? 2 : 1.5) : -6 + (s % 60) / 100;
      const messages = Array.from({ length: 120 }, (_, i) => ({
        measuredAt: new Date(start.getTime() + i * 10_000).toISOString(),
        pressure: pressureAt(i * 10),
        unit: "Pa",
        door: "closed",
      }));
      // Out of order: each pair of neighbours swapped. At least once: every seventh sent again.
      const sent: typeof messages = [];
      for (let i = 0; i < messages.length; i += 2) sent.push(...messages.slice(i, i + 2).reverse());
      for (let i = 0; i < messages.length; i += 7) sent.push(messages[i]!);
      // Subscribed once a probe comes through.
      const probe = `probe-${randomUUID().slice(0, 8)}`;
      await until(
        async () => {
          await monitor.publishAsync(pressureTopic(probe), "{}", { qos: 1 });
          return ingest.counts().received;
        },
        (received) => received > 0,
        "the subscription",
      );
      // Sent in seconds, a few at a time.
      for (let i = 0; i < sent.length; i += 6) {
        const latest = Math.max(...sent.slice(i, i + 6).map((m) => Date.parse(m.measuredAt)));
        if (latest + 5_000 > clock.getTime()) clock = new Date(latest + 5_000);
        await Promise.all(
          sent.slice(i, i + 6).map((message) =>
            monitor.publishAsync(pressureTopic(room.monitorId), JSON.stringify(message), {
              qos: 1,
            }),
          ),
        );
        await new Promise((resolve) => setTimeout(resolve, 20));
      }

      const raw = await until(
        async () =>
          (
            await db().execute<{ n: number }>(
              sql`select count(*)::int as n from pressure_readings where monitor_id = ${room.monitorId}`,
            )
          ).rows[0]!.n,
        (n) => n === 120,
        "every reading stored",
      );
      expect(raw).toBe(120);
      await alarmRoundsSettled(db());
      const alarms = await until(
        () =>
          db()
            .select()
            .from(pressureAlarms)
            .where(eq(pressureAlarms.monitorRowId, room.monitor.id))
            .orderBy(asc(pressureAlarms.startedAt)),
        (rows) => rows.length > 0 && rows.every((row) => row.endMailedAt !== null),
        "the excursion's end",
      );
      expect(alarms).toHaveLength(1);
      expect(alarms[0]).toMatchObject({
        kind: "out_of_range",
        startedAt: new Date(start.getTime() + 4 * minute),
        endedAt: new Date(start.getTime() + 16 * minute),
        worstPa: 2,
        criticalAt: new Date(start.getTime() + 14 * minute),
      });
      expect(alarms[0]!.actionId).not.toBeNull();

      const mails = await db()
        .select({ topic: outbox.topic, to: outbox.recipientId, text: outbox.textBody })
        .from(outbox)
        .where(
          and(
            inArray(outbox.recipientId, [room.lead.id, room.auditor.id, room.admin.id]),
            inArray(outbox.topic, ["pressure_alarm_started", "pressure_alarm_ended"]),
          ),
        );
      const who = (topic: string) =>
        mails
          .filter((mail) => mail.topic === topic)
          .map((mail) =>
            mail.to === room.lead.id ? "lead" : mail.to === room.auditor.id ? "auditor" : "admin",
          )
          .sort();
      expect(who("pressure_alarm_started")).toEqual(["auditor", "lead"]);
      expect(who("pressure_alarm_ended")).toEqual(["auditor", "lead"]);
      expect(mails.find((mail) => mail.topic === "pressure_alarm_ended")!.text).toContain("12 min");

      const actions = await db()
        .select()
        .from(correctiveActions)
        .where(eq(correctiveActions.spaceId, room.space.id));
      expect(actions).toHaveLength(1);
      expect(actions[0]).toMatchObject({
        id: alarms[0]!.actionId,
        itemKey: "room.pressure",
        severity: "critical",
      });

      // The roll-ups against the raw readings they came from, minute by minute and by the hour.
      for (const [table, size] of [
        ["pressure_minutes", "minute"],
        ["pressure_hours", "hour"],
      ] as const) {
        const { rows } = await db().execute<{
          bucket: string;
          rolled: number;
          raw: number;
          n: number;
          readings: number;
        }>(sql`
          select r.bucket, u.sum_pa / u.readings as rolled, r.raw, r.n, u.readings
            from (select date_trunc(${size}, measured_at, 'UTC') as bucket, avg(pressure_pa) as raw, count(*)::int as n
                    from pressure_readings where monitor_id = ${room.monitorId} group by 1) r
            full join (select * from ${sql.identifier(table)} where monitor_id = ${room.monitorId}) u
              on u.bucket_start = r.bucket
           order by 1`);
        expect(rows.length).toBeGreaterThan(0);
        for (const row of rows) {
          expect(row.readings).toBe(row.n);
          expect(row.rolled).toBeCloseTo(row.raw, 9);
        }
      }
    } finally {
      await ingest.stop();
      await alarmRoundsSettled(db());
    }
  });
});
