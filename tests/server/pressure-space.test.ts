import { and, eq, sql } from "drizzle-orm";
import { describe, expect, it } from "vitest";

import { pressureSpaceResponseSchema } from "@shared/schemas/pressure-space";

import { changeLog, pressureAlarms, pressureMonitors, spaces } from "../../server/db/schema/index";
import { rollUpQuery } from "../../server/modules/pressure/space.repository";
import { insertFloor, insertSpace } from "../factories/audits";
import {
  freshMonitorId,
  insertMonitoredRoom,
  insertPressureAlarm,
  storeTimeline,
} from "../factories/pressure-h3";
import { insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs } from "../helpers/auth";

const db = () => testApp().deps.db;
const minute = 60_000;
const hour = 60 * minute;

async function siteWith(
  role: "administrator" | "auditor" | "facilities_lead" | "committee_member",
  timeZone = "Europe/London",
) {
  const networkId = (await insertNetwork(db())).id;
  const site = await insertSite(db(), networkId, { timeZone });
  const person = await signInAs(networkId, [{ role, siteId: site.id }]);
  return { networkId, site, person };
}

async function read(cookie: string, spaceId: string, range = "24h") {
  return api(undefined, { cookie }).get(`/api/spaces/${spaceId}/pressure?range=${range}`);
}

/** The raw readings' averages per bucket, straight from the partitioned table. */
async function rawAverages(monitorId: string, size: "minute" | "hour") {
  const result = await db().execute<{
    at: string;
    mean: number;
    lo: number;
    hi: number;
    n: string;
  }>(sql`
    select date_trunc(${size}, measured_at, 'UTC') as at, avg(pressure_pa) as mean,
      min(pressure_pa) as lo, max(pressure_pa) as hi, count(*) as n
    from pressure_readings where monitor_id = ${monitorId} group by 1 order by 1`);
  return result.rows.map((row) => ({
    at: new Date(row.at).toISOString(),
    mean: Number(row.mean),
    lo: Number(row.lo),
    hi: Number(row.hi),
    n: Number(row.n),
  }));
}

describe("a room's pressure on its space page", () => {
  it("when a monitored room has readings in the last hours, then the 24-hour series gives each minute's mean, lowest and highest exactly as the raw readings average", async () => {
    const { site, person } = await siteWith("auditor");
    const { space, monitor } = await insertMonitoredRoom(db(), site.id);
    const now = Date.now();
    // Every 7 seconds for 40 minutes up to a minute ago, wobbling around −6 Pa.
    await storeTimeline(db(), monitor.monitorId, {
      from: new Date(now - 41 * minute),
      count: (40 * 60) / 7,
      everySeconds: 7,
      pressureAt: (i) => -6 + ((i * 37) % 11) / 5,
    });

    const reply = await read(person.cookie, space.id);
    expect(reply.status).toBe(200);
    const body = pressureSpaceResponseSchema.parse(reply.body);
    expect(body.bucket).toBe("minute");
    const raw = await rawAverages(monitor.monitorId, "minute");
    expect(body.series.map((p) => p.at)).toEqual(raw.map((r) => r.at));
    body.series.forEach((point, i) => {
      expect(point.meanPa).toBeCloseTo(raw[i]!.mean, 9);
      expect(point.minPa).toBe(raw[i]!.lo);
      expect(point.maxPa).toBe(raw[i]!.hi);
      expect(point.readings).toBe(raw[i]!.n);
    });
    // The table: one row an hour of the range, the readings adding up to all of them.
    expect(body.table.length).toBeGreaterThanOrEqual(24);
    expect(body.table.reduce((sum, row) => sum + row.readings, 0)).toBe(
      raw.reduce((sum, r) => sum + r.n, 0),
    );
    const withReadings = body.table.filter((row) => row.readings > 0);
    const rawHours = await rawAverages(monitor.monitorId, "hour");
    expect(withReadings.map((row) => row.from)).toEqual(rawHours.map((r) => r.at));
    withReadings.forEach((row, i) => expect(row.meanPa).toBeCloseTo(rawHours[i]!.mean, 9));
    expect(body.table.find((row) => row.readings === 0)?.meanPa).toBeNull();
    expect(body.live?.state).toBe("in_range");
  });

  it("when the 30-day range is asked for, then hourly means equal the raw averages and the table has one row a day in the site's time zone", async () => {
    const { site, person } = await siteWith("committee_member", "America/New_York");
    const { space, monitor } = await insertMonitoredRoom(db(), site.id);
    const now = Date.now();
    // Every 10 minutes for three days.
    await storeTimeline(db(), monitor.monitorId, {
      from: new Date(now - 3 * 24 * hour),
      count: 3 * 24 * 6,
      everySeconds: 600,
      pressureAt: (i) => -3 - (i % 7),
    });
    const body = pressureSpaceResponseSchema.parse(
      (await read(person.cookie, space.id, "30d")).body,
    );
    expect(body.bucket).toBe("hour");
    const raw = await rawAverages(monitor.monitorId, "hour");
    expect(body.series).toHaveLength(raw.length);
    body.series.forEach((point, i) => {
      expect(point.at).toBe(raw[i]!.at);
      expect(point.meanPa).toBeCloseTo(raw[i]!.mean, 9);
    });
    // 30 days and a part: 31 or 32 local days; each row starts at a local midnight but the first.
    expect(body.table.length).toBeGreaterThanOrEqual(31);
    expect(body.table.length).toBeLessThanOrEqual(32);
    for (const row of body.table.slice(1)) {
      const local = new Intl.DateTimeFormat("en-GB", {
        timeZone: "America/New_York",
        hour: "2-digit",
        minute: "2-digit",
        hourCycle: "h23",
      }).format(new Date(row.from));
      expect(local).toBe("00:00");
    }
    expect(body.table.reduce((sum, row) => sum + row.readings, 0)).toBe(3 * 24 * 6);
  });

  it("when the 30-day series is read, then PostgreSQL reads the hourly roll-ups through their primary key", async () => {
    // Enough rows that a plan has a real choice: a year of hours for 40 monitors.
    const monitors = Array.from({ length: 40 }, () => freshMonitorId("plan"));
    await db().execute(sql`
      insert into pressure_hours (monitor_id, bucket_start, readings, sum_pa, min_pa, max_pa)
      select m, date_trunc('hour', now()) - make_interval(hours => h), 720, -3600, -6, -4
      from unnest(${sql.param(monitors)}::varchar[]) as m, generate_series(0, 365 * 24) as h`);
    await db().execute(sql`analyze pressure_hours`);
    const query = rollUpQuery(
      db(),
      "hour",
      monitors[7]!,
      new Date(Date.now() - 30 * 24 * hour),
      new Date(),
    );
    const explained = await db().execute(sql`explain (format json) ${query}`);
    const plan = JSON.stringify(explained.rows[0]);
    const key = await db().execute<{ name: string }>(
      sql`select conname as name from pg_constraint where conrelid = 'pressure_hours'::regclass and contype = 'p'`,
    );
    expect(plan).toContain(`"Index Name":"${key.rows[0]!.name}"`);
    expect(plan).not.toContain('"Node Type":"Seq Scan"');
  });

  it("when an excursion is open, a silence is open, the last reading is stale or there is none, then the state says so", async () => {
    const { site, person } = await siteWith("facilities_lead");
    const now = Date.now();

    const never = await insertMonitoredRoom(db(), site.id);
    let body = pressureSpaceResponseSchema.parse((await read(person.cookie, never.space.id)).body);
    expect(body.live).toMatchObject({ state: "never_reported", latest: null });

    const out = await insertMonitoredRoom(db(), site.id);
    await storeTimeline(db(), out.monitor.monitorId, {
      from: new Date(now - 30_000),
      count: 1,
      everySeconds: 5,
      pressureAt: () => 1.5,
      doorAt: () => "open",
    });
    body = pressureSpaceResponseSchema.parse((await read(person.cookie, out.space.id)).body);
    expect(body.live?.state).toBe("out_of_range");
    expect(body.live?.latest).toMatchObject({
      pressure: 1.5,
      unit: "Pa",
      door: "open",
      meetsThreshold: false,
    });

    const alarm = await insertPressureAlarm(db(), out.monitor, {
      startedAt: new Date(now - 5 * minute),
    });
    body = pressureSpaceResponseSchema.parse((await read(person.cookie, out.space.id)).body);
    expect(body.live).toMatchObject({ state: "excursion", openAlarmId: alarm.id });

    const stale = await insertMonitoredRoom(db(), site.id);
    await storeTimeline(db(), stale.monitor.monitorId, {
      from: new Date(now - 25 * minute),
      count: 1,
      everySeconds: 5,
      pressureAt: () => -8,
    });
    body = pressureSpaceResponseSchema.parse((await read(person.cookie, stale.space.id)).body);
    expect(body.live?.state).toBe("no_readings");
    const silence = await insertPressureAlarm(db(), stale.monitor, {
      kind: "no_readings",
      startedAt: new Date(now - 25 * minute),
    });
    body = pressureSpaceResponseSchema.parse((await read(person.cookie, stale.space.id)).body);
    expect(body.live).toMatchObject({ state: "no_readings", openAlarmId: silence.id });
  });

  it("when a monitor reports in inches of water, then −0.01 in. w.c. meets the default threshold stated in that unit (CDC, 0.01 in. w.c. / 2.5 Pa)", async () => {
    const { site, person } = await siteWith("auditor");
    const { space, monitor } = await insertMonitoredRoom(db(), site.id);
    await storeTimeline(db(), monitor.monitorId, {
      from: new Date(Date.now() - 20_000),
      count: 1,
      everySeconds: 5,
      pressureAt: () => -0.01,
      unit: "inH2O",
    });
    const body = pressureSpaceResponseSchema.parse((await read(person.cookie, space.id)).body);
    expect(body.monitor).toMatchObject({
      unit: "inH2O",
      thresholdInUnit: -0.01,
      thresholdPa: -2.5,
      thresholdIsDefault: true,
    });
    expect(body.monitor?.thresholdWords).toMatch(/CDC/);
    expect(body.live).toMatchObject({ state: "in_range", latest: { meetsThreshold: true } });
  });

  it("when the room had excursions, then those in the range are listed newest first with duration, worst value, critical flag and who acknowledged with the note, and the table counts their minutes", async () => {
    const { site, networkId, person } = await siteWith("auditor");
    const { space, monitor } = await insertMonitoredRoom(db(), site.id);
    const lead = await signInAs(networkId, [{ role: "facilities_lead", siteId: site.id }], {
      user: { displayName: "Dana Okafor" },
    });
    const now = Date.now();
    const start = new Date(now - 3 * hour);
    await insertPressureAlarm(db(), monitor, {
      startedAt: start,
      endedAt: new Date(start.getTime() + 18 * minute),
      worst: { value: 4.2, unit: "Pa", pa: 4.2, at: new Date(start.getTime() + 9 * minute) },
      criticalAt: new Date(start.getTime() + 15 * minute),
      acknowledged: {
        by: lead.user.id,
        at: new Date(start.getTime() + 4 * minute),
        note: "Door was propped open; closed it.",
      },
    });
    const recent = await insertPressureAlarm(db(), monitor, {
      startedAt: new Date(now - 6 * minute),
      worst: { value: 0.004, unit: "inH2O", pa: 0.996, at: new Date(now - 5 * minute) },
    });
    // Two days ago: outside the 24-hour range, inside the 30-day one.
    await insertPressureAlarm(db(), monitor, {
      startedAt: new Date(now - 48 * hour),
      endedAt: new Date(now - 48 * hour + 3 * minute),
    });

    const body = pressureSpaceResponseSchema.parse((await read(person.cookie, space.id)).body);
    expect(body.alarmCount).toBe(2);
    expect(body.alarms.map((a) => a.id)[0]).toBe(recent.id);
    expect(body.alarms[0]).toMatchObject({
      endedAt: null,
      critical: false,
      acknowledgement: null,
      worst: { value: 0.004, unit: "inH2O" },
    });
    expect(body.alarms[0]!.durationMinutes).toBeGreaterThanOrEqual(6);
    expect(body.alarms[1]).toMatchObject({
      durationMinutes: 18,
      critical: true,
      worst: { value: 4.2, unit: "Pa", pressurePa: 4.2 },
      acknowledgement: { byName: "Dana Okafor", note: "Door was propped open; closed it." },
    });
    const inExcursion = body.table.reduce((sum, row) => sum + row.excursionMinutes, 0);
    expect(inExcursion).toBeGreaterThanOrEqual(18 + 6);
    expect(inExcursion).toBeLessThan(18 + 6 + 1);

    const month = pressureSpaceResponseSchema.parse(
      (await read(person.cookie, space.id, "30d")).body,
    );
    expect(month.alarmCount).toBe(3);
  });

  it("when a room has more alarms than a page lists, then the answer stays bounded and says how many there are", async () => {
    const { site, person } = await siteWith("auditor");
    const { space, monitor } = await insertMonitoredRoom(db(), site.id);
    const now = Date.now();
    for (let i = 0; i < 130; i += 1)
      await insertPressureAlarm(db(), monitor, {
        startedAt: new Date(now - (i + 1) * 5 * minute),
        endedAt: new Date(now - (i + 1) * 5 * minute + 2 * minute),
      });
    const body = pressureSpaceResponseSchema.parse((await read(person.cookie, space.id)).body);
    expect(body.alarms).toHaveLength(100);
    expect(body.alarmCount).toBe(130);
  });

  it("when no monitor is mapped, then the answer says so and gives no series", async () => {
    const { site, person } = await siteWith("auditor");
    const floor = await insertFloor(db(), site.id);
    const room = await insertSpace(db(), floor, "isolation_room");
    const body = pressureSpaceResponseSchema.parse((await read(person.cookie, room.id)).body);
    expect(body).toMatchObject({ monitor: null, live: null, series: [], table: [], alarms: [] });
    expect(body.space).toMatchObject({ takesMonitor: true, retired: false });
  });

  it("when someone of another site or network asks, then they get 404; a bad range is a 400 naming it", async () => {
    const { site, networkId, person } = await siteWith("auditor");
    const { space } = await insertMonitoredRoom(db(), site.id);
    const otherSite = await insertSite(db(), networkId);
    const elsewhere = await signInAs(networkId, [{ role: "administrator", siteId: otherSite.id }]);
    expect((await read(elsewhere.cookie, space.id)).status).toBe(404);
    const otherNetwork = (await insertNetwork(db())).id;
    const stranger = await signInAs(otherNetwork, [{ role: "administrator", siteId: null }]);
    expect((await read(stranger.cookie, space.id)).status).toBe(404);
    expect((await api().get(`/api/spaces/${space.id}/pressure`)).status).toBe(401);
    const bad = await read(person.cookie, space.id, "7d");
    expect(bad.status).toBe(400);
    expect(bad.body.error.fields).toHaveProperty("range");
  });
});

describe("mapping a monitor to a room", () => {
  async function adminAndRoom(
    zoneType: "isolation_room" | "anteroom" | "doffing_area" = "isolation_room",
  ) {
    const { site, networkId, person } = await siteWith("administrator");
    const floor = await insertFloor(db(), site.id);
    const room = await insertSpace(db(), floor, zoneType);
    return { site, networkId, admin: person, floor, room };
  }
  const put = (cookie: string, spaceId: string, body: object) =>
    api(undefined, { cookie }).put(`/api/spaces/${spaceId}/monitor`).send(body);

  it("when an administrator maps a monitor with a threshold, then the room reads it and the change log has it", async () => {
    const { admin, room } = await adminAndRoom();
    const monitorId = freshMonitorId();
    const reply = await put(admin.cookie, room.id, { monitorId, thresholdPa: -5 });
    expect(reply.status).toBe(200);
    expect(reply.body.monitor).toMatchObject({
      monitorId,
      thresholdPa: -5,
      thresholdIsDefault: false,
    });
    const body = pressureSpaceResponseSchema.parse((await read(admin.cookie, room.id)).body);
    expect(body.monitor?.monitorId).toBe(monitorId);
    expect(body.live?.state).toBe("never_reported");

    // Back to the default threshold, then a new id: both logged, the id changed in place.
    const changed = await put(admin.cookie, room.id, { monitorId: `${monitorId}-b` });
    expect(changed.status).toBe(200);
    expect(changed.body.monitor).toMatchObject({ thresholdPa: -2.5, thresholdIsDefault: true });
    const log = await db()
      .select({ action: changeLog.action, before: changeLog.before, after: changeLog.after })
      .from(changeLog)
      .where(eq(changeLog.entityId, room.id))
      .orderBy(changeLog.occurredAt);
    expect(log).toEqual([
      { action: "pressure-monitor.mapped", before: null, after: { monitorId, thresholdPa: -5 } },
      {
        action: "pressure-monitor.updated",
        before: { monitorId, thresholdPa: -5 },
        after: { monitorId: `${monitorId}-b`, thresholdPa: null },
      },
    ]);
  });

  it("when the monitor id is already mapped to another room, then 409 names the field and the room, and nothing changes", async () => {
    const { admin, site, room } = await adminAndRoom();
    const taken = await insertMonitoredRoom(db(), site.id);
    const reply = await put(admin.cookie, room.id, { monitorId: taken.monitor.monitorId });
    expect(reply.status).toBe(409);
    expect(reply.body.error.fields.monitorId).toContain(taken.space.name);
    const rows = await db()
      .select()
      .from(pressureMonitors)
      .where(eq(pressureMonitors.spaceId, room.id));
    expect(rows).toHaveLength(0);
  });

  it("when the monitor is mapped at another site, then the 409 does not name that site's room", async () => {
    const { admin, networkId, room } = await adminAndRoom();
    const other = await insertSite(db(), networkId);
    const taken = await insertMonitoredRoom(db(), other.id);
    const reply = await put(admin.cookie, room.id, { monitorId: taken.monitor.monitorId });
    expect(reply.status).toBe(409);
    expect(reply.body.error.fields.monitorId).toContain("another site");
    expect(reply.body.error.message).not.toContain(taken.space.name);
  });

  it("when the space is an anteroom or a doffing area, then the mapping is refused naming the monitor field", async () => {
    for (const zone of ["anteroom", "doffing_area"] as const) {
      const { admin, room } = await adminAndRoom(zone);
      const reply = await put(admin.cookie, room.id, { monitorId: freshMonitorId() });
      expect(reply.status).toBe(409);
      expect(reply.body.error.fields.monitorId).toMatch(/isolation rooms/);
    }
  });

  it("when the room is retired, then a mapping is refused and none is stored", async () => {
    const { admin, room } = await adminAndRoom();
    await db()
      .update(spaces)
      .set({ retiredAt: new Date(), retirementId: crypto.randomUUID() })
      .where(eq(spaces.id, room.id));
    const reply = await put(admin.cookie, room.id, { monitorId: freshMonitorId() });
    expect(reply.status).toBe(409);
    expect(reply.body.error.message).toMatch(/retired/);
    expect(
      await db().select().from(pressureMonitors).where(eq(pressureMonitors.spaceId, room.id)),
    ).toHaveLength(0);
  });

  it("when the threshold is less negative than the CDC's 2.5 Pa or the id cannot be a topic level, then 400 names the field", async () => {
    const { admin, room } = await adminAndRoom();
    const weak = await put(admin.cookie, room.id, { monitorId: freshMonitorId(), thresholdPa: -1 });
    expect(weak.status).toBe(400);
    expect(weak.body.error.fields).toHaveProperty("thresholdPa");
    const slash = await put(admin.cookie, room.id, { monitorId: "ward/4" });
    expect(slash.status).toBe(400);
    expect(slash.body.error.fields).toHaveProperty("monitorId");
  });

  it("when people other than the site's administrators try to map, then auditors, leads and committee members get 403 and another site's administrator 404", async () => {
    const { site, networkId, room } = await adminAndRoom();
    for (const role of ["auditor", "facilities_lead", "committee_member"] as const) {
      const person = await signInAs(networkId, [{ role, siteId: site.id }]);
      expect((await put(person.cookie, room.id, { monitorId: freshMonitorId() })).status).toBe(403);
    }
    const other = await insertSite(db(), networkId);
    const otherAdmin = await signInAs(networkId, [{ role: "administrator", siteId: other.id }]);
    expect((await put(otherAdmin.cookie, room.id, { monitorId: freshMonitorId() })).status).toBe(
      404,
    );
  });

  it("when the monitor is unmapped, then it is gone and logged; with alarms, they end and stay in the room's log, and the id can move to another room", async () => {
    const { admin, site, room } = await adminAndRoom();
    await put(admin.cookie, room.id, { monitorId: freshMonitorId() });
    const gone = await api(undefined, { cookie: admin.cookie }).delete(
      `/api/spaces/${room.id}/monitor`,
    );
    expect(gone.status).toBe(204);
    expect(
      await db().select().from(pressureMonitors).where(eq(pressureMonitors.spaceId, room.id)),
    ).toHaveLength(0);
    const [entry] = await db()
      .select()
      .from(changeLog)
      .where(
        and(eq(changeLog.entityId, room.id), eq(changeLog.action, "pressure-monitor.unmapped")),
      );
    expect(entry).toBeDefined();
    expect(
      (await api(undefined, { cookie: admin.cookie }).delete(`/api/spaces/${room.id}/monitor`))
        .status,
    ).toBe(404);

    // A monitor with alarms comes off too (it moved): its open alarm ends, the room's log keeps
    // both, and the same id can then go to another room.
    const alarmed = await insertMonitoredRoom(db(), site.id);
    await insertPressureAlarm(db(), alarmed.monitor, {
      startedAt: new Date(Date.now() - 3 * hour),
      endedAt: new Date(Date.now() - 2 * hour),
    });
    const open = await insertPressureAlarm(db(), alarmed.monitor, {
      startedAt: new Date(Date.now() - hour),
    });
    const moved = await api(undefined, { cookie: admin.cookie }).delete(
      `/api/spaces/${alarmed.space.id}/monitor`,
    );
    expect(moved.status).toBe(204);
    const log = await db()
      .select()
      .from(pressureAlarms)
      .where(eq(pressureAlarms.spaceId, alarmed.space.id));
    expect(log).toHaveLength(2);
    expect(log.every((alarm) => alarm.endedAt !== null && alarm.monitorRowId === null)).toBe(true);
    expect(log.find((alarm) => alarm.id === open.id)!.endedAt!.getTime()).toBeGreaterThan(
      open.startedAt.getTime(),
    );
    const page = await read(admin.cookie, alarmed.space.id);
    expect(page.body.monitor).toBeNull();
    expect(page.body.alarmCount).toBe(2);
    expect(
      (await put(admin.cookie, room.id, { monitorId: alarmed.monitor.monitorId })).status,
    ).toBe(200);
  });

  it("when two rooms map the same monitor at the same moment, then one wins and the other gets a 409 naming the field", async () => {
    const { admin, floor } = await adminAndRoom();
    const a = await insertSpace(db(), floor, "isolation_room");
    const b = await insertSpace(db(), floor, "isolation_room");
    const monitorId = freshMonitorId();
    const replies = await Promise.all([
      put(admin.cookie, a.id, { monitorId }),
      put(admin.cookie, b.id, { monitorId }),
    ]);
    expect(replies.map((r) => r.status).sort()).toEqual([200, 409]);
    const refused = replies.find((r) => r.status === 409)!;
    expect(refused.body.error.fields).toHaveProperty("monitorId");
  });
});
