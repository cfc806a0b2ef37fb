import { randomInt, randomUUID } from "node:crypto";
import { createServer } from "node:net";

import { sql } from "drizzle-orm";
import mqtt, { type MqttClient } from "mqtt";
import { afterAll, afterEach, beforeAll, describe, expect, it } from "vitest";

import { pressureTopic } from "@shared/schemas/pressure-readings";

import { connectDatabase, type Database } from "../../server/db/client";
import {
  createPressureIngest,
  type PressureIngest,
} from "../../server/modules/pressure/ingest.service";
import { createLogger } from "../../server/lib/logger";
import { startMqttBroker, type MqttBroker } from "../../scripts/lib/mqtt-broker";
import { testApp } from "../helpers/app";
import { ingestDay } from "../helpers/made-up-dates";
import { testEnv } from "../helpers/test-env";

const db = () => testApp().deps.db;
const logger = createLogger("silent");

let broker: MqttBroker;
let publisher: MqttClient;
const running: PressureIngest[] = [];

beforeAll(async () => {
  broker = await startMqttBroker();
  publisher = await mqtt.connectAsync(broker.url, { clientId: `monitors-${randomUUID()}` });
});
afterEach(async () => {
  await Promise.all(running.splice(0).map((ingest) => ingest.stop()));
});
afterAll(async () => {
  await publisher?.endAsync();
  await broker?.stop();
});

/** A day of its own, far ahead, so this test's tallies are not shared with another's. */
function ownClock() {
  const day = ingestDay();
  const now = new Date(day + 12 * 3_600_000);
  return {
    now,
    day: now.toISOString().slice(0, 10),
    at: (s: number) => new Date(now.getTime() + s * 1000),
  };
}

function ingestFor(
  now: Date,
  options: { lockKey?: bigint; clientId?: string; db?: Database } = {},
) {
  const ingest = createPressureIngest({
    db: options.db ?? db(),
    databaseUrl: testEnv().DATABASE_URL,
    logger,
    mqtt: {
      url: broker.url,
      rejectUnauthorized: true,
      clientId: options.clientId ?? `lintel-${randomUUID()}`,
      topicPrefix: "lintel/pressure",
    },
    now: () => now,
    lockKey: options.lockKey ?? BigInt(randomInt(1, 2 ** 40)),
    lockRetryMs: 150,
    retryMs: 100,
  });
  running.push(ingest);
  return ingest;
}

async function until(check: () => boolean | Promise<boolean>, what: string, ms = 8_000) {
  const end = Date.now() + ms;
  while (Date.now() < end) {
    if (await check()) return;
    await new Promise((resolve) => setTimeout(resolve, 25));
  }
  throw new Error(`timed out waiting for ${what}`);
}

async function subscribed(ingest: PressureIngest) {
  await until(() => ingest.state() === "ingesting", "the lock");
  // A probe on a monitor of its own: once it is received, the subscription is in place.
  const probe = `probe-${randomUUID().slice(0, 8)}`;
  const before = ingest.counts().received;
  await until(async () => {
    await publisher.publishAsync(pressureTopic(probe), "{}", { qos: 1 });
    await new Promise((resolve) => setTimeout(resolve, 50));
    return ingest.counts().received > before;
  }, "the subscription");
}

const publish = (monitorId: string, payload: object | string) =>
  publisher.publishAsync(
    pressureTopic(monitorId),
    typeof payload === "string" ? payload : JSON.stringify(payload),
    { qos: 1 },
  );

async function stored(monitorId: string) {
  const { rows } = await db().execute<{ measured_at: string; pressure_pa: number }>(
    sql`select measured_at, pressure_pa from pressure_readings where monitor_id = ${monitorId} order by measured_at`,
  );
  return rows.map((row) => ({ at: new Date(row.measured_at).toISOString(), pa: row.pressure_pa }));
}

async function tallies(day: string) {
  const { rows } = await db().execute<{ outcome: string; count: number }>(
    sql`select outcome, count from pressure_ingest_tallies where day = ${day} and source = 'mqtt'`,
  );
  return Object.fromEntries(rows.map((row) => [row.outcome, Number(row.count)]));
}

describe("ingesting readings from the broker", () => {
  it("when a monitor's messages arrive twice and out of order, then each reading is stored once, in time order", async () => {
    const clock = ownClock();
    const ingest = ingestFor(clock.now);
    await ingest.start();
    await subscribed(ingest);
    const monitor = `m-${randomUUID().slice(0, 8)}`;
    const sent = [
      { measuredAt: clock.at(-30).toISOString(), pressure: -6.1, unit: "Pa" },
      { measuredAt: clock.at(-20).toISOString(), pressure: -5.9, unit: "Pa", door: "closed" },
      { measuredAt: clock.at(-10).toISOString(), pressure: 0.004, unit: "in. w.c." },
    ];
    for (const payload of [sent[2]!, sent[0]!, sent[2]!, sent[1]!, sent[0]!])
      await publish(monitor, payload);
    await until(
      async () => (await stored(monitor)).length === 3 && ingest.counts().duplicates === 2,
      "three stored",
    );
    await ingest.flush();
    expect(await stored(monitor)).toEqual([
      { at: clock.at(-30).toISOString(), pa: -6.1 },
      { at: clock.at(-20).toISOString(), pa: -5.9 },
      // 0.004 in. w.c. is about +1 Pa (1 in. w.c. = 249.089 Pa).
      { at: clock.at(-10).toISOString(), pa: expect.closeTo(0.996, 3) },
    ]);
    expect(await tallies(clock.day)).toMatchObject({ stored: 3, duplicate: 2 });
  });

  it("when a reading is dated beyond a minute ahead of Lintel's clock, then it is refused and counted, and the next one is stored", async () => {
    const clock = ownClock();
    const ingest = ingestFor(clock.now);
    await ingest.start();
    await subscribed(ingest);
    const monitor = `m-${randomUUID().slice(0, 8)}`;
    await publish(monitor, { measuredAt: clock.at(61).toISOString(), pressure: -4, unit: "Pa" });
    await publish(monitor, { measuredAt: clock.at(55).toISOString(), pressure: -4.5, unit: "Pa" });
    await until(
      () => ingest.counts().future === 1 && ingest.counts().stored === 1,
      "one refused, one stored",
    );
    expect(await stored(monitor)).toEqual([{ at: clock.at(55).toISOString(), pa: -4.5 }]);
    expect((await tallies(clock.day)).future).toBe(1);
  });

  it("when messages are not readings, then each is counted as invalid, nothing of it is stored, and ingestion carries on", async () => {
    const clock = ownClock();
    const ingest = ingestFor(clock.now);
    await ingest.start();
    await subscribed(ingest);
    const monitor = `m-${randomUUID().slice(0, 8)}`;
    const invalidBefore = ingest.counts().invalid;
    await publish(monitor, "not json at all");
    await publish(monitor, { measuredAt: clock.at(-5).toISOString(), pressure: "low", unit: "Pa" });
    await publish(monitor, { measuredAt: clock.at(-5).toISOString(), pressure: -3, unit: "mbar" });
    await publish(monitor, {
      measuredAt: clock.at(-5).toISOString(),
      pressure: -3,
      unit: "Pa",
      monitorId: "another",
    });
    // A topic level that is no monitor id.
    await publisher.publishAsync("lintel/pressure/room 4 east", "{}", { qos: 1 });
    await publish(monitor, "x".repeat(5000));
    await publish(monitor, { measuredAt: clock.at(-1).toISOString(), pressure: -7.25, unit: "Pa" });
    await until(async () => (await stored(monitor)).length === 1, "the good reading");
    await ingest.flush();
    expect(ingest.counts().invalid - invalidBefore).toBe(6);
    expect(await stored(monitor)).toEqual([{ at: clock.at(-1).toISOString(), pa: -7.25 }]);
    // The day's tally counts these and the subscription probes ("{}", not readings either).
    expect(await tallies(clock.day)).toMatchObject({ invalid: ingest.counts().invalid, stored: 1 });
    expect(ingest.state()).toBe("ingesting");
  });

  it("when two processes ingest, then only the lock holder stores; when it stops, the other takes over and receives what was published meanwhile", async () => {
    const clock = ownClock();
    const lockKey = BigInt(randomInt(1, 2 ** 40));
    const clientId = `lintel-${randomUUID()}`;
    const first = ingestFor(clock.now, { lockKey, clientId });
    const second = ingestFor(clock.now, { lockKey, clientId });
    await first.start();
    await second.start();
    await subscribed(first);
    // The second tries the lock several times meanwhile and never gets it.
    await new Promise((resolve) => setTimeout(resolve, 500));
    expect(second.state()).toBe("standby");

    const monitor = `m-${randomUUID().slice(0, 8)}`;
    await publish(monitor, { measuredAt: clock.at(-40).toISOString(), pressure: -5, unit: "Pa" });
    await until(async () => (await stored(monitor)).length === 1, "the first reading");
    expect(second.counts().received).toBe(0);

    await first.stop();
    // Published while nobody listens: the broker keeps it for the kept session.
    await publish(monitor, { measuredAt: clock.at(-30).toISOString(), pressure: -5.5, unit: "Pa" });
    await until(() => second.state() === "ingesting", "the takeover");
    await publish(monitor, { measuredAt: clock.at(-20).toISOString(), pressure: -6, unit: "Pa" });
    await until(
      async () => (await stored(monitor)).length === 3,
      "the readings after the takeover",
    );
    expect(second.counts().stored).toBeGreaterThanOrEqual(2);
    expect((await stored(monitor)).map((row) => row.pa)).toEqual([-5, -5.5, -6]);
  });

  it("when the database is away, then no reading is acknowledged, and after a stop the next process gets it from the broker and stores it", async () => {
    const clock = ownClock();
    const lockKey = BigInt(randomInt(1, 2 ** 40));
    const clientId = `lintel-${randomUUID()}`;
    // A database address where nothing listens: the store fails the way it does when PostgreSQL
    // is down, while the ingest lock (its own connection) still works.
    const port = await new Promise<number>((resolve) => {
      const probe = createServer().listen(0, "127.0.0.1", () => {
        const { port } = probe.address() as { port: number };
        probe.close(() => resolve(port));
      });
    });
    const away = new URL(testEnv().DATABASE_URL);
    away.port = String(port);
    const unreachable = connectDatabase(away.toString(), { connectionTimeoutMs: 500 });
    try {
      const first = ingestFor(clock.now, { lockKey, clientId, db: unreachable.db });
      await first.start();
      await subscribed(first);
      const monitor = `m-${randomUUID().slice(0, 8)}`;
      await publish(monitor, {
        measuredAt: clock.at(-15).toISOString(),
        pressure: -6.5,
        unit: "Pa",
      });
      // Several failed tries while the process keeps running.
      await new Promise((resolve) => setTimeout(resolve, 600));
      expect(first.counts().stored).toBe(0);
      await first.stop();

      const second = ingestFor(clock.now, { lockKey, clientId });
      await second.start();
      await until(async () => (await stored(monitor)).length === 1, "the reading redelivered");
      expect(await stored(monitor)).toEqual([{ at: clock.at(-15).toISOString(), pa: -6.5 }]);
    } finally {
      await unreachable.close();
    }
  });
});
