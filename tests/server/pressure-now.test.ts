import { and, eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";

import type { PressureNowResponse, PressureRoomNow } from "@shared/schemas/pressure-site";

import { changeLog, pressureAlarms, spaces } from "../../server/db/schema/index";
import { monitoredRoomsQuery } from "../../server/modules/pressure/site.repository";
import { insertFloor, insertSpace } from "../factories/audits";
import {
  insertAlarmH4,
  insertMonitorH4,
  readingsH4,
  storeReadingsH4,
} from "../factories/pressure-h4";
import { insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";

const db = () => testApp().deps.db;
const minute = 60_000;
const ago = (ms: number) => new Date(Date.now() - ms);

async function world() {
  const network = await insertNetwork(db());
  const site = await insertSite(db(), network.id);
  const otherSite = await insertSite(db(), network.id);
  const floor = await insertFloor(db(), site.id);
  const room = async () => {
    const space = await insertSpace(db(), floor, "isolation_room");
    const monitor = await insertMonitorH4(db(), space);
    return { space, monitor };
  };
  const person = (
    role: "facilities_lead" | "auditor" | "administrator" | "committee_member",
    at = site.id,
  ) => signInAs(network.id, [{ role, siteId: at }]);
  return { network, site, otherSite, floor, room, person };
}

async function pressureNow(person: SignedInPerson, siteId: string) {
  const reply = await api(undefined, { cookie: person.cookie }).get(
    `/api/sites/${siteId}/pressure-now`,
  );
  expect(reply.status, JSON.stringify(reply.body)).toBe(200);
  return reply.body as PressureNowResponse;
}

const roomOf = (body: PressureNowResponse, spaceId: string): PressureRoomNow => {
  const room = body.rooms.find((r) => r.spaceId === spaceId);
  expect(room, `room ${spaceId}`).toBeDefined();
  return room!;
};

describe("a site's rooms' pressure now", () => {
  it("when rooms have readings and alarms of every kind, then each room's state follows its open alarm, else its newest reading", async () => {
    const w = await world();
    const negative = await w.room();
    const withinGrace = await w.room();
    const drifting = await w.room();
    const silentNoAlarmYet = await w.room();
    const silentWithAlarm = await w.room();
    const never = await w.room();
    const endedExcursion = await w.room();

    // Negative for a minute: in range (the CDC's −2.5 Pa, references.md; −3.1 Pa meets it).
    await storeReadingsH4(db(), readingsH4(negative.monitor.monitorId, ago(minute), [-3, -3.1]));
    // Newest reading −2.4 Pa misses −2.5 Pa, no alarm yet: out of range within the grace.
    await storeReadingsH4(
      db(),
      readingsH4(withinGrace.monitor.monitorId, ago(30_000), [-3.0, -2.4]),
    );
    // An open excursion wins even when the newest reading is back in range (the job decides the end).
    await storeReadingsH4(db(), readingsH4(drifting.monitor.monitorId, ago(20_000), [1.2, -3]));
    const alarm = await insertAlarmH4(db(), drifting.monitor, {
      startedAt: ago(6 * minute),
      worstValue: 1.2,
      worstPa: 1.2,
    });
    // Silent for 11 minutes (limit 10), the alarm job not yet run: no readings all the same.
    await storeReadingsH4(
      db(),
      readingsH4(silentNoAlarmYet.monitor.monitorId, ago(11 * minute), [-3]),
    );
    // Silent with its alarm open.
    await storeReadingsH4(
      db(),
      readingsH4(silentWithAlarm.monitor.monitorId, ago(30 * minute), [-3]),
    );
    const silence = await insertAlarmH4(db(), silentWithAlarm.monitor, {
      kind: "no_readings",
      startedAt: ago(30 * minute),
      worstValue: null,
      worstUnit: null,
      worstPa: null,
    });
    // An excursion that has ended leaves the room to its newest reading.
    await storeReadingsH4(db(), readingsH4(endedExcursion.monitor.monitorId, ago(10_000), [-4]));
    await insertAlarmH4(db(), endedExcursion.monitor, {
      startedAt: ago(40 * minute),
      endedAt: ago(30 * minute),
    });

    const lead = await w.person("facilities_lead");
    const body = await pressureNow(lead, w.site.id);
    expect(body.siteName).toBe(w.site.name);
    expect(body.rooms).toHaveLength(7);
    expect(roomOf(body, negative.space.id)).toMatchObject({
      state: "in_range",
      thresholdPa: -2.5,
      latest: { pressure: -3.1, unit: "Pa" },
      alarm: null,
    });
    expect(roomOf(body, withinGrace.space.id)).toMatchObject({
      state: "out_of_range",
      latest: { pressure: -2.4 },
      alarm: null,
    });
    expect(roomOf(body, drifting.space.id)).toMatchObject({
      state: "excursion",
      alarm: {
        id: alarm.id,
        kind: "out_of_range",
        since: alarm.startedAt.toISOString(),
        worstValue: 1.2,
        worstUnit: "Pa",
        acknowledgedAt: null,
      },
    });
    expect(roomOf(body, silentNoAlarmYet.space.id)).toMatchObject({
      state: "no_readings",
      alarm: null,
    });
    expect(roomOf(body, silentWithAlarm.space.id)).toMatchObject({
      state: "no_readings",
      alarm: { id: silence.id, kind: "no_readings" },
    });
    expect(roomOf(body, never.space.id)).toMatchObject({
      state: "never_reported",
      latest: null,
    });
    expect(roomOf(body, endedExcursion.space.id)).toMatchObject({ state: "in_range", alarm: null });
  });

  it("when a room has its own threshold, then its newest reading is judged against that figure", async () => {
    const w = await world();
    const space = await insertSpace(db(), w.floor, "isolation_room");
    const monitor = await insertMonitorH4(db(), space, { thresholdPa: -5 });
    await storeReadingsH4(db(), readingsH4(monitor.monitorId, ago(10_000), [-4]));
    const body = await pressureNow(await w.person("auditor"), w.site.id);
    expect(roomOf(body, space.id)).toMatchObject({ state: "out_of_range", thresholdPa: -5 });
  });

  it("when a room is retired or belongs to another site, then it is not listed", async () => {
    const w = await world();
    const kept = await w.room();
    const retired = await w.room();
    await db()
      .update(spaces)
      .set({ retiredAt: new Date(), retirementId: crypto.randomUUID() })
      .where(eq(spaces.id, retired.space.id));
    const otherFloor = await insertFloor(db(), w.otherSite.id);
    const elsewhere = await insertSpace(db(), otherFloor, "isolation_room");
    await insertMonitorH4(db(), elsewhere);
    const body = await pressureNow(await w.person("administrator"), w.site.id);
    expect(body.rooms.map((room) => room.spaceId)).toEqual([kept.space.id]);
  });

  it("when the newest reading is looked up, then PostgreSQL reads the readings' index backwards, one row per month, never the whole table", async () => {
    const w = await world();
    const { monitor } = await w.room();
    // Two months of readings, so the lookup spans partitions.
    const start = new Date(Date.now() - 40 * 24 * 60 * minute);
    const pressures = Array.from({ length: 2000 }, (_, i) => -3 - (i % 5) / 10);
    await storeReadingsH4(
      db(),
      readingsH4(monitor.monitorId, start, pressures, { everySeconds: 1800 }),
    );
    await db().execute(sql`analyze pressure_readings`);
    const plan = await db().execute<{ "QUERY PLAN": string }>(
      sql`explain ${monitoredRoomsQuery(w.site.id)}`,
    );
    const text = plan.rows.map((row) => row["QUERY PLAN"]).join("\n");
    expect(text).toMatch(/Limit/);
    expect(text).toMatch(/Index (Only )?Scan Backward using pressure_readings_\w+/);
    expect(text).not.toMatch(/Seq Scan on pressure_readings/);
  });
});

describe("acknowledging a room-pressure alarm", () => {
  async function openAlarm() {
    const w = await world();
    const { monitor, space } = await w.room();
    const alarm = await insertAlarmH4(db(), monitor);
    return { ...w, monitor, space, alarm };
  }
  const acknowledge = (person: SignedInPerson, alarmId: string, body: unknown) =>
    api(undefined, { cookie: person.cookie })
      .post(`/api/pressure-alarms/${alarmId}/acknowledge`)
      .send(body as object);

  it("when the facilities lead acknowledges with a note, then the alarm keeps who, when and the trimmed note, the change log has it, and the site's rooms show it", async () => {
    const w = await openAlarm();
    const lead = await w.person("facilities_lead");
    const reply = await acknowledge(lead, w.alarm.id, {
      note: "  Door was propped open; closed it.  ",
    });
    expect(reply.status, JSON.stringify(reply.body)).toBe(200);
    expect(reply.body.alarm).toMatchObject({
      id: w.alarm.id,
      acknowledgedByName: lead.user.displayName,
      acknowledgementNote: "Door was propped open; closed it.",
    });
    const [stored] = await db()
      .select()
      .from(pressureAlarms)
      .where(eq(pressureAlarms.id, w.alarm.id));
    expect(stored!.acknowledgedBy).toBe(lead.user.id);
    expect(stored!.acknowledgementNote).toBe("Door was propped open; closed it.");
    expect(stored!.endedAt).toBeNull();
    const log = await db()
      .select()
      .from(changeLog)
      .where(and(eq(changeLog.entity, "pressure_alarm"), eq(changeLog.entityId, w.alarm.id)));
    expect(log).toHaveLength(1);
    expect(log[0]).toMatchObject({
      action: "pressure_alarm.acknowledged",
      actorId: lead.user.id,
      siteId: w.site.id,
      reason: "Door was propped open; closed it.",
    });
    const body = await pressureNow(lead, w.site.id);
    expect(roomOf(body, w.space.id).alarm).toMatchObject({
      acknowledgedByName: lead.user.displayName,
      acknowledgementNote: "Door was propped open; closed it.",
    });
  });

  it("when an alarm is acknowledged a second time, then 409 names who acknowledged it first and the first note stays", async () => {
    const w = await openAlarm();
    const lead = await w.person("facilities_lead");
    const auditor = await w.person("auditor");
    expect((await acknowledge(lead, w.alarm.id, { note: "Fan reset" })).status).toBe(200);
    const again = await acknowledge(auditor, w.alarm.id, { note: "Seen it" });
    expect(again.status).toBe(409);
    expect(again.body.error.code).toBe("conflict");
    expect(again.body.error.message).toContain("already acknowledged");
    expect(again.body.error.message).toContain(lead.user.displayName);
    const [stored] = await db()
      .select()
      .from(pressureAlarms)
      .where(eq(pressureAlarms.id, w.alarm.id));
    expect(stored!.acknowledgementNote).toBe("Fan reset");
    expect(stored!.acknowledgedBy).toBe(lead.user.id);
  });

  it("when the note is missing, blank or too long, then 400 names the note and nothing is stored", async () => {
    const w = await openAlarm();
    const lead = await w.person("facilities_lead");
    for (const body of [{}, { note: "   " }, { note: "x".repeat(501) }, { note: 5 }]) {
      const reply = await acknowledge(lead, w.alarm.id, body);
      expect(reply.status, JSON.stringify(body)).toBe(400);
      expect(Object.keys(reply.body.error.fields ?? {})).toContain("note");
    }
    const [stored] = await db()
      .select()
      .from(pressureAlarms)
      .where(eq(pressureAlarms.id, w.alarm.id));
    expect(stored!.acknowledgedAt).toBeNull();
  });

  it("when a committee member or someone of another site tries, then 403 or 404 and the alarm stays unacknowledged", async () => {
    const w = await openAlarm();
    const committee = await w.person("committee_member");
    expect((await acknowledge(committee, w.alarm.id, { note: "Looked" })).status).toBe(403);
    const elsewhere = await w.person("facilities_lead", w.otherSite.id);
    expect((await acknowledge(elsewhere, w.alarm.id, { note: "Looked" })).status).toBe(404);
    const unknown = await acknowledge(await w.person("administrator"), crypto.randomUUID(), {
      note: "Looked",
    });
    expect(unknown.status).toBe(404);
    const [stored] = await db()
      .select()
      .from(pressureAlarms)
      .where(eq(pressureAlarms.id, w.alarm.id));
    expect(stored!.acknowledgedAt).toBeNull();
  });
});

describe("a room's last 24 hours", () => {
  it("when a room has readings today and older, then only the last 24 hours come back, a point a minute, with min, mean, max and minutes out of range", async () => {
    const w = await world();
    const { space, monitor } = await w.room();
    // Two days ago: not in the window.
    await storeReadingsH4(db(), readingsH4(monitor.monitorId, ago(48 * 60 * minute), [9, 9]));
    // Three minutes: (−3, −4), (−2, −2) out of range, (−5, −6).
    const start = new Date(Math.floor((Date.now() - 60 * minute) / minute) * minute);
    await storeReadingsH4(
      db(),
      readingsH4(monitor.monitorId, start, [-3, -4], { everySeconds: 20 }),
    );
    await storeReadingsH4(
      db(),
      readingsH4(monitor.monitorId, new Date(start.getTime() + minute), [-2, -2], {
        everySeconds: 20,
      }),
    );
    await storeReadingsH4(
      db(),
      readingsH4(monitor.monitorId, new Date(start.getTime() + 2 * minute), [-5, -6], {
        everySeconds: 20,
      }),
    );
    const auditor = await w.person("auditor");
    const reply = await api(undefined, { cookie: auditor.cookie }).get(
      `/api/spaces/${space.id}/pressure-24h`,
    );
    expect(reply.status).toBe(200);
    expect(reply.body.points).toHaveLength(3);
    expect(reply.body.points[1]).toMatchObject({ meanPa: -2, minPa: -2, maxPa: -2 });
    expect(reply.body.summary).toEqual({
      minPa: -6,
      meanPa: (-3 - 4 - 2 - 2 - 5 - 6) / 6,
      maxPa: -2,
      minutes: 3,
      minutesOutOfRange: 1,
    });
  });

  it("when a room has no monitor, then the answer says so with no points", async () => {
    const w = await world();
    const space = await insertSpace(db(), w.floor, "isolation_room");
    const reply = await api(undefined, { cookie: (await w.person("auditor")).cookie }).get(
      `/api/spaces/${space.id}/pressure-24h`,
    );
    expect(reply.status).toBe(200);
    expect(reply.body).toMatchObject({
      monitorId: null,
      points: [],
      summary: null,
      thresholdPa: -2.5,
    });
  });
});
