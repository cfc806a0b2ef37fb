import { randomUUID } from "node:crypto";

import { asc, eq, inArray } from "drizzle-orm";
import { beforeAll, describe, expect, it } from "vitest";

import type { CommitteePressureResponse } from "@shared/schemas/committee-pressure";
import type { PressureReading } from "@shared/schemas/pressure-readings";
import type { ZoneType } from "@shared/zones";

import { pressureMonitorMappings, pressureMonitors } from "../../server/db/schema/index";
import { pressureFigures } from "../../server/modules/committee/pressure.service";
import { storeReadings } from "../../server/modules/pressure/readings.repository";
import { insertFloor, insertSpace } from "../factories/audits";
import { insertAlarmH5, insertMonitorH5 } from "../factories/pressure-h5";
import { insertNetwork, insertSite } from "../factories/records";
import { api, testApp } from "../helpers/app";
import { signInAs, type SignedInPerson } from "../helpers/auth";
import { readExport } from "../helpers/csv";
import { readPdfLayout, rowOn, type PdfPage } from "../helpers/pdf-layout";

/*
 * The figures are worked out again here from the seeded rows, without the server's SQL: the
 * months of a site in New York are written out by hand as UTC instants (EST is UTC−5 until
 * 8 March 2026, EDT UTC−4 after), the monitored minutes are the distinct minutes of the seeded
 * readings, and an excursion's hours are its overlap with the month.
 */
const newYorkMonths: Record<string, [Date, Date]> = {
  "2026-01": [new Date("2026-01-01T05:00:00Z"), new Date("2026-02-01T05:00:00Z")],
  "2026-02": [new Date("2026-02-01T05:00:00Z"), new Date("2026-03-01T05:00:00Z")],
  // Clocks go forward on 8 March: the month ends at midnight EDT, 04:00 UTC.
  "2026-03": [new Date("2026-03-01T05:00:00Z"), new Date("2026-04-01T04:00:00Z")],
};
const period = { from: "2026-01", to: "2026-03" };
const query = `from=${period.from}&to=${period.to}`;

// The exact 95% Poisson limits for a count (Garwood), as printed in the standard tables of exact
// Poisson confidence limits (from memory; the same values as chi-square(0.025; 2k)/2 and
// chi-square(0.975; 2k+2)/2, checked against SciPy in tests/shared/poisson-interval.test.ts).
const exact95: Record<number, [number, number]> = {
  1: [0.0253, 5.572],
  2: [0.242, 7.225],
  3: [0.619, 8.767],
};

function every(monitorId: string, from: string, to: string, stepSeconds: number) {
  const readings: PressureReading[] = [];
  for (let t = new Date(from).getTime(); t < new Date(to).getTime(); t += stepSeconds * 1000)
    readings.push({ monitorId, measuredAt: new Date(t), pressure: -6, unit: "Pa", door: null });
  return readings;
}

interface SeededAlarm {
  spaceId: string;
  zoneType: ZoneType;
  kind: "out_of_range" | "no_readings";
  startedAt: Date;
  endedAt: Date | null;
}
interface SeededMonitor {
  monitorId: string;
  spaceId: string;
  zoneType: ZoneType;
}

/** The site's figures for a month, from the seeded rows alone. */
function expected(
  monitors: SeededMonitor[],
  readings: PressureReading[],
  alarms: SeededAlarm[],
  month: string,
  zoneType?: ZoneType,
) {
  const [starts, ends] = newYorkMonths[month]!;
  const kept = monitors.filter((m) => !zoneType || m.zoneType === zoneType);
  const rooms = kept.map((monitor) => {
    const minutes = new Set(
      readings
        .filter((r) => r.monitorId === monitor.monitorId)
        .filter((r) => r.measuredAt >= starts && r.measuredAt < ends)
        .map((r) => Math.floor(r.measuredAt.getTime() / 60_000)),
    );
    const own = alarms.filter((a) => a.spaceId === monitor.spaceId && a.kind === "out_of_range");
    let seconds = 0;
    for (const alarm of own) {
      const end = alarm.endedAt ?? new Date();
      const from = Math.max(alarm.startedAt.getTime(), starts.getTime());
      const to = Math.min(end.getTime(), ends.getTime());
      if (to > from) seconds += (to - from) / 1000;
    }
    return {
      spaceId: monitor.spaceId,
      monitoredHours: minutes.size / 60,
      hoursOutOfRange: seconds / 3600,
      excursions: own.filter((a) => a.startedAt >= starts && a.startedAt < ends).length,
    };
  });
  const sum = (pick: (room: (typeof rooms)[number]) => number) =>
    rooms.reduce((total, room) => total + pick(room), 0);
  return {
    rooms,
    excursions: sum((room) => room.excursions),
    monitoredHours: sum((room) => room.monitoredHours),
    hoursOutOfRange: sum((room) => room.hoursOutOfRange),
  };
}

describe("committee room-pressure figures", () => {
  const db = () => testApp().deps.db;
  let networkId = "";
  let alder = { id: "", name: "" };
  let birch = { id: "", name: "" };
  let elsewhere = { id: "", name: "" };
  const monitors: SeededMonitor[] = [];
  const readings: PressureReading[] = [];
  const alarms: SeededAlarm[] = [];
  const names: Record<string, string> = {};
  let unmonitoredRoom = "";
  let committee: SignedInPerson;
  let committeeAtBirch: SignedInPerson;
  let otherCommittee: SignedInPerson;
  let nobody: SignedInPerson;

  beforeAll(async () => {
    networkId = (await insertNetwork(db())).id;
    const tag = randomUUID().slice(0, 4);
    const a = await insertSite(db(), networkId, {
      name: `Alder Pressure ${tag}`,
      timeZone: "America/New_York",
    });
    const b = await insertSite(db(), networkId, { name: `Birch Pressure ${tag}` });
    alder = { id: a.id, name: a.name };
    birch = { id: b.id, name: b.name };
    const floor = await insertFloor(db(), a.id);
    const roomOne = await insertSpace(db(), floor, "isolation_room");
    const roomTwo = await insertSpace(db(), floor, "isolation_room");
    const doffing = await insertSpace(db(), floor, "doffing_area");
    unmonitoredRoom = (await insertSpace(db(), floor, "isolation_room")).id;
    await insertSpace(db(), await insertFloor(db(), b.id), "isolation_room");
    for (const space of [roomOne, roomTwo, doffing]) names[space.id] = space.name;

    const m1 = await insertMonitorH5(db(), roomOne);
    const m2 = await insertMonitorH5(db(), roomTwo);
    const m3 = await insertMonitorH5(db(), doffing);
    monitors.push(
      { monitorId: m1.monitorId, spaceId: roomOne.id, zoneType: "isolation_room" },
      { monitorId: m2.monitorId, spaceId: roomTwo.id, zoneType: "isolation_room" },
      { monitorId: m3.monitorId, spaceId: doffing.id, zoneType: "doffing_area" },
    );

    // Room one: readings every 20 s across the January/February boundary (05:00 UTC), with a
    // ten-minute silence; room two: mid-January and the last half hour of March; the doffing
    // area: ten minutes in January.
    readings.push(
      ...every(m1.monitorId, "2026-02-01T03:00:00Z", "2026-02-01T06:20:00Z", 20),
      ...every(m1.monitorId, "2026-02-01T06:30:00Z", "2026-02-01T07:00:00Z", 20),
      ...every(m2.monitorId, "2026-01-15T10:00:07Z", "2026-01-15T12:00:00Z", 60),
      ...every(m2.monitorId, "2026-03-31T12:00:00Z", "2026-03-31T12:30:00Z", 30),
      ...every(m3.monitorId, "2026-01-20T08:00:00Z", "2026-01-20T08:10:00Z", 30),
    );
    const now = new Date("2026-04-02T00:00:00Z");
    await storeReadings(db(), readings, { source: "upload", now });
    // Delivered again: stored once, so no minute counts twice.
    await storeReadings(db(), readings.slice(0, 200), { source: "mqtt", now });

    const seed = async (
      monitor: typeof m1,
      zoneType: ZoneType,
      startedAt: string,
      endedAt: string | null,
      kind: SeededAlarm["kind"] = "out_of_range",
    ) => {
      const alarm = {
        spaceId: monitor.spaceId,
        zoneType,
        kind,
        startedAt: new Date(startedAt),
        endedAt: endedAt ? new Date(endedAt) : null,
      };
      await insertAlarmH5(db(), monitor, alarm);
      alarms.push(alarm);
    };
    // Began in December (site time): its January part counts as hours, not as an excursion.
    await seed(m1, "isolation_room", "2025-12-31T20:00:00Z", "2026-01-01T06:00:00Z");
    // Crosses the month boundary: started in January (23:30 on the 31st, site time).
    await seed(m1, "isolation_room", "2026-02-01T04:30:00Z", "2026-02-01T05:45:00Z");
    await seed(m1, "isolation_room", "2026-02-01T06:10:00Z", "2026-02-01T06:13:00Z");
    await seed(m2, "isolation_room", "2026-01-15T10:30:00Z", "2026-01-15T11:00:00Z");
    // A silent monitor is an alarm but not an excursion.
    await seed(m2, "isolation_room", "2026-01-15T12:00:00Z", "2026-01-15T13:00:00Z", "no_readings");
    // Still running: counts to the end of March on the site's clock.
    await seed(m2, "isolation_room", "2026-03-31T12:00:00Z", null);
    await seed(m3, "doffing_area", "2026-01-20T08:02:00Z", "2026-01-20T08:05:00Z");

    // Another network's site, monitor and excursion: never in this network's figures.
    const otherNetwork = (await insertNetwork(db())).id;
    const c = await insertSite(db(), otherNetwork, { name: `Cedar Pressure ${tag}` });
    elsewhere = { id: c.id, name: c.name };
    const otherRoom = await insertSpace(db(), await insertFloor(db(), c.id), "isolation_room");
    const m4 = await insertMonitorH5(db(), otherRoom);
    await storeReadings(
      db(),
      every(m4.monitorId, "2026-01-10T00:00:00Z", "2026-01-10T02:00:00Z", 60),
      {
        source: "upload",
        now,
      },
    );
    await insertAlarmH5(db(), m4, {
      startedAt: new Date("2026-01-10T00:30:00Z"),
      endedAt: new Date("2026-01-10T01:00:00Z"),
    });

    committee = await signInAs(networkId, [{ role: "committee_member", siteId: null }]);
    committeeAtBirch = await signInAs(networkId, [{ role: "committee_member", siteId: b.id }]);
    otherCommittee = await signInAs(otherNetwork, [{ role: "committee_member", siteId: null }]);
    nobody = await signInAs(networkId, []);
  });

  async function figures(person: SignedInPerson, extra = "") {
    const response = await api(undefined, { cookie: person.cookie }).get(
      `/api/committee/pressure?${query}${extra}`,
    );
    expect(response.status).toBe(200);
    return response.body as CommitteePressureResponse;
  }

  it("when a committee member reads the period, then each month's hours out of range, monitored hours and excursions per room match the seeded readings and alarms", async () => {
    const body = await figures(committee);
    expect(body.sites.map((site) => site.siteId)).toEqual([alder.id, birch.id]);
    const site = body.sites[0]!;
    expect(site.monitors).toBe(3);
    expect(site.months.map((month) => month.month)).toEqual(["2026-01", "2026-02", "2026-03"]);
    for (const month of site.months) {
      const want = expected(monitors, readings, alarms, month.month);
      expect(month.excursions, month.month).toBe(want.excursions);
      expect(month.monitoredHours, month.month).toBeCloseTo(want.monitoredHours, 9);
      expect(month.hoursOutOfRange, month.month).toBeCloseTo(want.hoursOutOfRange, 6);
      // Every monitored room is listed, with or without readings that month; no other room.
      expect(month.rooms.map((room) => room.spaceId).sort()).toEqual(
        want.rooms.map((room) => room.spaceId).sort(),
      );
      expect(month.rooms.map((room) => room.spaceId)).not.toContain(unmonitoredRoom);
      for (const room of month.rooms) {
        const wanted = want.rooms.find((entry) => entry.spaceId === room.spaceId)!;
        expect(room.spaceName).toBe(names[room.spaceId]);
        expect(room.monitoredHours, `${month.month} ${room.spaceName}`).toBeCloseTo(
          wanted.monitoredHours,
          9,
        );
        expect(room.hoursOutOfRange, `${month.month} ${room.spaceName}`).toBeCloseTo(
          wanted.hoursOutOfRange,
          6,
        );
        expect(room.excursions).toBe(wanted.excursions);
      }
    }
    // Worked by hand: room one has the hour carried over from December plus the half hour of the
    // boundary excursion before midnight in January, and 45 + 3 minutes in February.
    const roomOne = monitors[0]!.spaceId;
    const inMonth = (month: number) =>
      site.months[month]!.rooms.find((r) => r.spaceId === roomOne)!;
    expect(inMonth(0).hoursOutOfRange).toBeCloseTo(1.5, 9);
    expect(inMonth(0).excursions).toBe(1);
    expect(inMonth(1).hoursOutOfRange).toBeCloseTo(0.8, 9);
    expect(inMonth(1).excursions).toBe(1);
    // 120 minutes before midnight, 120 − 10 after.
    expect(inMonth(0).monitoredHours).toBe(2);
    expect(inMonth(1).monitoredHours).toBeCloseTo(110 / 60, 12);
    // March: the open excursion from 12:00 UTC on the 31st to midnight EDT (04:00 UTC) = 16 h.
    const roomTwoMarch = site.months[2]!.rooms.find((r) => r.spaceId === monitors[1]!.spaceId)!;
    expect(roomTwoMarch.hoursOutOfRange).toBeCloseTo(16, 9);
  });

  it("when a month has excursions over monitored hours, then the rate per 1,000 hours carries the exact Poisson interval of the count, scaled", async () => {
    const body = await figures(committee);
    const [january, february, march] = body.sites[0]!.months;
    expect(body.per).toBe(1000);
    expect(body.confidence).toBe(0.95);
    for (const month of [january!, february!, march!]) {
      const [lower, upper] = exact95[month.excursions]!;
      const scale = 1000 / month.monitoredHours;
      expect(month.rate!.rate).toBeCloseTo(month.excursions * scale, 9);
      // Back on the count's scale, the bounds agree with the printed table to its last digit.
      expect(month.rate!.lower / scale, month.month).toBeCloseTo(lower, lower < 0.1 ? 4 : 3);
      expect(month.rate!.upper / scale, month.month).toBeCloseTo(upper, 3);
    }
    // January by hand: 3 excursions in 250 minutes.
    expect(january!.excursions).toBe(3);
    expect(january!.monitoredHours).toBeCloseTo(250 / 60, 12);
    expect(january!.rate!.rate).toBeCloseTo(720, 9);
  });

  it("when a site has no monitors, then it says so with no months, rather than zeros", async () => {
    const body = await figures(committee);
    const site = body.sites.find((entry) => entry.siteId === birch.id)!;
    expect(site).toEqual({ siteId: birch.id, siteName: birch.name, monitors: 0, months: [] });
  });

  it("when the view is narrowed to isolation rooms, then the doffing area's monitor and excursion leave the figures", async () => {
    const body = await figures(committee, "&zoneType=isolation_room");
    expect(body.zoneType).toBe("isolation_room");
    const site = body.sites[0]!;
    expect(site.monitors).toBe(2);
    for (const month of site.months) {
      const want = expected(monitors, readings, alarms, month.month, "isolation_room");
      expect(month.excursions).toBe(want.excursions);
      expect(month.monitoredHours).toBeCloseTo(want.monitoredHours, 9);
      expect(month.hoursOutOfRange).toBeCloseTo(want.hoursOutOfRange, 6);
      expect(month.rooms).toHaveLength(2);
    }
    expect(site.months[0]!.excursions).toBe(2);
  });

  it("when a month had no monitored minute, then it has no rate; an excursion still running is clipped at now", async () => {
    const at = new Date("2026-03-31T14:00:00Z");
    const body = await pressureFigures(
      db(),
      networkId,
      [{ role: "committee_member", siteId: null }],
      { from: "2026-03", to: "2026-04" },
      at,
    );
    const [march, april] = body.sites[0]!.months;
    expect(march!.hoursOutOfRange).toBeCloseTo(2, 9);
    expect(march!.excursions).toBe(1);
    expect(april).toMatchObject({
      excursions: 0,
      monitoredHours: 0,
      hoursOutOfRange: 0,
      rate: null,
    });
  });

  it("when people of other sites, other networks or no role ask, then they see only their own sites or are refused", async () => {
    const atBirch = await figures(committeeAtBirch);
    expect(atBirch.sites.map((site) => site.siteId)).toEqual([birch.id]);

    const other = await figures(otherCommittee);
    expect(other.sites.map((site) => site.siteId)).toEqual([elsewhere.id]);
    expect(other.sites[0]!.months[0]).toMatchObject({ excursions: 1, monitoredHours: 2 });

    const refused = await api(undefined, { cookie: nobody.cookie }).get(
      `/api/committee/pressure?${query}`,
    );
    expect(refused.status).toBe(403);
    const signedOut = await api().get(`/api/committee/pressure?${query}`);
    expect(signedOut.status).toBe(401);
    const badPeriod = await api(undefined, { cookie: committee.cookie }).get(
      "/api/committee/pressure?from=2026-05&to=2026-01",
    );
    expect(badPeriod.status).toBe(400);
    expect(badPeriod.body.error.fields).toHaveProperty("to");
  });

  it("when the figures are exported, then the CSV has each site's month with its rate and interval, each room's row, and the site without monitors", async () => {
    const response = await api(undefined, { cookie: committee.cookie }).get(
      `/api/committee/pressure/export?${query}`,
    );
    expect(response.status).toBe(200);
    expect(response.headers["content-type"]).toMatch(/text\/csv/);
    const { objects } = readExport(response.text);
    const january = objects.find(
      (row) => row.site === alder.name && row.month === "2026-01" && row.room === "",
    )!;
    const want = expected(monitors, readings, alarms, "2026-01");
    expect(Number(january["monitored hours"])).toBeCloseTo(want.monitoredHours, 2);
    expect(Number(january["hours out of range"])).toBeCloseTo(want.hoursOutOfRange, 2);
    expect(january["excursions started"]).toBe("3");
    expect(Number(january["excursions per 1,000 monitored hours"])).toBeCloseTo(720, 3);
    expect(
      Number(january["95% interval low (exact Poisson)"]) * (want.monitoredHours / 1000),
    ).toBeCloseTo(0.619, 3);
    expect(
      Number(january["95% interval high (exact Poisson)"]) * (want.monitoredHours / 1000),
    ).toBeCloseTo(8.767, 3);
    const roomRows = objects.filter(
      (row) => row.site === alder.name && row.month === "2026-01" && row.room !== "",
    );
    expect(roomRows.map((row) => row.room).sort()).toEqual(Object.values(names).sort());
    expect(objects.filter((row) => row.site === birch.name)).toEqual([
      expect.objectContaining({ month: "", note: "No monitors" }),
    ]);
  });

  it("when the monthly report is printed, then a page headed Room pressure holds each site's month with its rate in words and each room's hours, inside the margins", async () => {
    const response = await api(undefined, { cookie: committee.cookie })
      .get(`/api/committee/report?${query}`)
      .buffer(true)
      .parse((res, done) => {
        const chunks: Buffer[] = [];
        res.on("data", (chunk: Buffer) => chunks.push(chunk));
        res.on("end", () => done(null, Buffer.concat(chunks)));
      });
    expect(response.status).toBe(200);
    const pages = await readPdfLayout(response.body as Buffer);
    const start = pages.findIndex((page) =>
      page.items.some((item) => item.text === "Room pressure" && item.y < 48 + 30),
    );
    expect(start, "a page that starts with Room pressure").toBeGreaterThan(0);
    const pressurePages = pages.slice(start);
    const body = await figures(committee);
    const siteHeader = [
      "Site",
      "Month",
      "Excursions",
      "Monitored hours",
      "Per 1,000 h (95% interval)",
    ];
    const oneDecimal = (value: number) =>
      value > 0 && value < 0.05
        ? "< 0.1"
        : value.toLocaleString("en-GB", { minimumFractionDigits: 1, maximumFractionDigits: 1 });
    const words = (value: number) =>
      value === 0 || value >= 0.1 ? oneDecimal(value) : value.toPrecision(2);
    const found = (header: string[], cells: string[]) =>
      pressurePages.some((page: PdfPage) => rowOn(page, header, cells) !== null);
    for (const month of body.sites[0]!.months) {
      const cells = [
        alder.name,
        month.month,
        String(month.excursions),
        oneDecimal(month.monitoredHours),
        `${words(month.rate!.rate)} (${words(month.rate!.lower)} to ${words(month.rate!.upper)})`,
      ];
      expect(found(siteHeader, cells), cells.join(" | ")).toBe(true);
    }
    // January in figures a reader can check: 3 in 4.2 hours → 720.0 (148.5 to 2,104.1).
    expect(found(siteHeader, [alder.name, "2026-01", "3", "4.2", "720.0 (148.5 to 2,104.1)"])).toBe(
      true,
    );
    const roomHeader = [
      "Site",
      "Month",
      "Room",
      "Monitored hours",
      "Hours out of range",
      "Excursions",
    ];
    for (const month of body.sites[0]!.months)
      for (const room of month.rooms) {
        const cells = [
          alder.name,
          month.month,
          room.spaceName,
          oneDecimal(room.monitoredHours),
          oneDecimal(room.hoursOutOfRange),
          String(room.excursions),
        ];
        expect(found(roomHeader, cells), cells.join(" | ")).toBe(true);
      }
    const text = pressurePages.flatMap((page) => page.items.map((item) => item.text)).join(" ");
    expect(text).toContain(`No monitors: ${birch.name}.`);
    for (const page of pressurePages) {
      for (const item of page.items) {
        const where = `page ${page.number}: "${item.text}"`;
        expect(item.x, where).toBeGreaterThanOrEqual(48 - 0.5);
        expect(item.right, where).toBeLessThanOrEqual(page.width - 48 + 0.5);
      }
    }
  });
});

describe("a monitor that moved between rooms", () => {
  const db = () => testApp().deps.db;

  it("when the mapping changes (a new id, taken off, mapped again), then the history records each room's stretch, and a re-used id starts at the change", async () => {
    const networkId = (await insertNetwork(db())).id;
    const site = await insertSite(db(), networkId);
    const floor = await insertFloor(db(), site.id);
    const roomA = await insertSpace(db(), floor, "isolation_room");
    const roomB = await insertSpace(db(), floor, "isolation_room");
    const admin = await signInAs(networkId, [{ role: "administrator", siteId: site.id }]);
    const put = (spaceId: string, monitorId: string) =>
      api(undefined, { cookie: admin.cookie })
        .put(`/api/spaces/${spaceId}/monitor`)
        .send({ monitorId, thresholdPa: null });
    const tag = randomUUID().slice(0, 6);
    const [x, y] = [`move-x-${tag}`, `move-y-${tag}`];

    expect((await put(roomA.id, x)).status).toBe(200);
    expect((await put(roomA.id, y)).status).toBe(200); // a new id on room A
    const off = await api(undefined, { cookie: admin.cookie }).delete(
      `/api/spaces/${roomA.id}/monitor`,
    );
    expect(off.status).toBe(204);
    expect((await put(roomB.id, x)).status).toBe(200); // x moves to room B

    const rows = await db()
      .select()
      .from(pressureMonitorMappings)
      .where(inArray(pressureMonitorMappings.monitorId, [x, y]))
      .orderBy(asc(pressureMonitorMappings.monitorId), asc(pressureMonitorMappings.mappedAt));
    const shown = rows.map((row) => ({
      monitorId: row.monitorId,
      spaceId: row.spaceId,
      fromStart: !Number.isFinite(row.mappedAt.getTime()),
      open: row.unmappedAt === null,
    }));
    expect(shown).toEqual([
      // First mapped ids reach back to their first reading; a re-used one starts at the move.
      { monitorId: x, spaceId: roomA.id, fromStart: true, open: false },
      { monitorId: x, spaceId: roomB.id, fromStart: false, open: true },
      { monitorId: y, spaceId: roomA.id, fromStart: true, open: false },
    ]);
  });

  it("when a monitor moved from one room to another on 1 February, then its January hours stay with the first room and its February hours go to the second", async () => {
    const networkId = (await insertNetwork(db())).id;
    const site = await insertSite(db(), networkId, { timeZone: "UTC" });
    const floor = await insertFloor(db(), site.id);
    const roomA = await insertSpace(db(), floor, "isolation_room");
    const roomB = await insertSpace(db(), floor, "isolation_room");
    const monitorId = `moved-${randomUUID().slice(0, 8)}`;
    const mapped = await insertMonitorH5(db(), roomA, monitorId);
    // Moved: off room A, onto room B; the stretches then dated to the move on 1 February.
    await db().delete(pressureMonitors).where(eq(pressureMonitors.id, mapped.id));
    await insertMonitorH5(db(), roomB, monitorId);
    const move = new Date("2026-02-01T00:00:00Z");
    await db()
      .update(pressureMonitorMappings)
      .set({ unmappedAt: move })
      .where(eq(pressureMonitorMappings.spaceId, roomA.id));
    await db()
      .update(pressureMonitorMappings)
      .set({ mappedAt: move })
      .where(eq(pressureMonitorMappings.spaceId, roomB.id));
    // An hour of readings a minute apart in each month.
    await storeReadings(
      db(),
      [
        ...every(monitorId, "2026-01-10T10:00:00Z", "2026-01-10T11:00:00Z", 60),
        ...every(monitorId, "2026-02-10T10:00:00Z", "2026-02-10T11:00:00Z", 60),
      ],
      { source: "upload", now: new Date("2026-03-01T00:00:00Z") },
    );

    const body = await pressureFigures(
      db(),
      networkId,
      [{ role: "committee_member", siteId: null }],
      { from: "2026-01", to: "2026-02" },
      new Date("2026-03-01T00:00:00Z"),
    );
    const [january, february] = body.sites[0]!.months;
    const hours = (month: typeof january, spaceId: string) =>
      month!.rooms.find((room) => room.spaceId === spaceId)?.monitoredHours ?? 0;
    expect(body.sites[0]!.monitors).toBe(1);
    expect([hours(january, roomA.id), hours(january, roomB.id)]).toEqual([1, 0]);
    expect([hours(february, roomA.id), hours(february, roomB.id)]).toEqual([0, 1]);
  });
});
