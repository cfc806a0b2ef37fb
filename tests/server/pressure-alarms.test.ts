import { and, asc, eq, inArray } from "drizzle-orm";
import { describe, expect, it } from "vitest";

import type { PressureReading } from "@shared/schemas/pressure-readings";

import {
  correctiveActions,
  outbox,
  pressureAlarms,
  pressureMonitors,
  spaces,
} from "../../server/db/schema/index";
import { evaluatePressureAlarms } from "../../server/modules/pressure/alarms.job";
import { storeReadings } from "../../server/modules/pressure/readings.repository";
import { insertMonitoredRoom, timeline } from "../factories/pressure-h2";
import { insertSpace } from "../factories/audits";
import { insertGrant, insertUser } from "../factories/records";
import { testApp } from "../helpers/app";

// The threshold is the CDC's for airborne infection isolation rooms: at least 2.5 Pa (0.01 in.
// w.c.) negative to the corridor (CDC, Guidelines for Preventing the Transmission of
// Mycobacterium tuberculosis in Health-Care Settings, MMWR 2005;54(RR-17)). −5 Pa meets it,
// +1 Pa does not. The 60 s grace, 5 min door grace, 2 min merge gap, 15 min action limit and
// 10 min silence are Lintel's defaults (common practice, no published figure).

const deps = () => ({ ...testApp().deps, notifyOutbox: () => {} });
const db = () => testApp().deps.db;
const minute = 60_000;
const at = (start: Date, minutes: number) => new Date(start.getTime() + minutes * minute);

/** Each test its own day, so the mapping and the readings never meet another test's. */
let day = 0;
function newStart(): Date {
  day += 1;
  return new Date(Date.UTC(2026, 10, 1 + day, 8, 0, 0));
}

type Room = Awaited<ReturnType<typeof insertMonitoredRoom>>;

async function run(room: Room, now: Date) {
  return evaluatePressureAlarms(deps(), { now, monitorIds: [room.monitorId] });
}

/**
 * Plays the readings as they would arrive: every `stepSeconds` of the clock, what was measured
 * by then is stored and the alarm job runs, as the ingest hook runs it.
 */
async function play(
  room: Room,
  readings: PressureReading[],
  from: Date,
  to: Date,
  stepSeconds = 30,
) {
  let next = 0;
  const sorted = [...readings].sort((a, b) => a.measuredAt.getTime() - b.measuredAt.getTime());
  for (let t = from.getTime(); t <= to.getTime(); t += stepSeconds * 1000) {
    const now = new Date(t);
    const due: PressureReading[] = [];
    while (next < sorted.length && sorted[next]!.measuredAt.getTime() <= t)
      due.push(sorted[next++]!);
    if (due.length > 0) await storeReadings(db(), due, { source: "mqtt", now });
    await run(room, now);
  }
}

async function alarmsOf(room: Room) {
  return db()
    .select()
    .from(pressureAlarms)
    .where(eq(pressureAlarms.monitorRowId, room.monitor.id))
    .orderBy(asc(pressureAlarms.kind), asc(pressureAlarms.startedAt));
}

async function mailsFor(room: Room) {
  const people = [room.lead.id, room.auditor.id, room.admin.id];
  const rows = await db()
    .select({
      topic: outbox.topic,
      recipientId: outbox.recipientId,
      subject: outbox.subject,
      text: outbox.textBody,
    })
    .from(outbox)
    .where(inArray(outbox.recipientId, people))
    .orderBy(asc(outbox.createdAt));
  const name = (id: string | null) =>
    id === room.lead.id ? "lead" : id === room.auditor.id ? "auditor" : "admin";
  return rows.map((row) => ({ ...row, to: name(row.recipientId) }));
}

const topics = (mails: Awaited<ReturnType<typeof mailsFor>>, topic: string) =>
  mails
    .filter((mail) => mail.topic === topic)
    .map((mail) => mail.to)
    .sort();

/** −5 Pa, out of range (+1 Pa) for the minutes in `out`, every 10 s. */
const negativeExcept =
  (out: [number, number][]) =>
  (t: number): number =>
    out.some(([a, b]) => t >= a * 60 && t < b * 60) ? 1 : -5;

describe("room-pressure alarms", () => {
  it("when a room is out of range for four minutes, then one alarm starts and ends, and the facilities lead and auditor get one start and one end e-mail each", async () => {
    const start = newStart();
    const room = await insertMonitoredRoom(db(), { mappedAt: start });
    const readings = timeline(room.monitorId, start, 20 * 60, 10, negativeExcept([[5, 9]]));
    await play(room, readings, start, at(start, 20));

    const alarms = await alarmsOf(room);
    expect(alarms).toHaveLength(1);
    expect(alarms[0]).toMatchObject({
      kind: "out_of_range",
      startedAt: at(start, 5),
      // The grace of 60 s ran out a minute after the first reading out of range.
      alarmAt: at(start, 6),
      endedAt: at(start, 9),
      worstPa: 1,
      criticalAt: null,
      actionId: null,
    });
    const mails = await mailsFor(room);
    expect(topics(mails, "pressure_alarm_started")).toEqual(["auditor", "lead"]);
    expect(topics(mails, "pressure_alarm_ended")).toEqual(["auditor", "lead"]);
    const ended = mails.find((mail) => mail.topic === "pressure_alarm_ended")!;
    expect(ended.text).toContain("4 min");
    expect(ended.text).toContain("1.0 Pa");
    expect(ended.text).toContain(`/spaces/${room.space.id}/audits`);
    expect(ended.text).toContain("not a life-safety alarm system");

    // Again, and twice at once: nothing more is written or sent.
    await run(room, at(start, 20));
    await Promise.all([run(room, at(start, 21)), run(room, at(start, 21))]);
    expect(await mailsFor(room)).toHaveLength(4);
    expect(await alarmsOf(room)).toHaveLength(1);
  });

  it("when two rounds run at once as an excursion starts, then the start is mailed once", async () => {
    const start = newStart();
    const room = await insertMonitoredRoom(db(), { mappedAt: start });
    const readings = timeline(room.monitorId, start, 8 * 60, 10, negativeExcept([[5, 8]]));
    await storeReadings(db(), readings, { source: "mqtt", now: at(start, 8) });
    const rounds = await Promise.all([
      run(room, at(start, 8)),
      run(room, at(start, 8)),
      run(room, at(start, 8)),
    ]);
    expect(rounds.map((round) => round.changed).sort()).toEqual([0, 0, 1]);
    expect(topics(await mailsFor(room), "pressure_alarm_started")).toEqual(["auditor", "lead"]);
    const [alarm] = await alarmsOf(room);
    expect(alarm).toMatchObject({ startedAt: at(start, 5), endedAt: null });
  });

  it("when two stretches out of range are less than 2 minutes apart, then they are one alarm; 3 minutes apart, two", async () => {
    const start = newStart();
    const near = await insertMonitoredRoom(db(), { mappedAt: start });
    const far = await insertMonitoredRoom(db(), { mappedAt: start });
    await play(
      near,
      timeline(
        near.monitorId,
        start,
        20 * 60,
        10,
        negativeExcept([
          [3, 5],
          [6, 8],
        ]),
      ),
      start,
      at(start, 20),
    );
    await play(
      far,
      timeline(
        far.monitorId,
        start,
        20 * 60,
        10,
        negativeExcept([
          [3, 5],
          [8, 10],
        ]),
      ),
      start,
      at(start, 20),
    );
    const joined = await alarmsOf(near);
    expect(joined).toHaveLength(1);
    expect(joined[0]).toMatchObject({ startedAt: at(start, 3), endedAt: at(start, 8) });
    expect(topics(await mailsFor(near), "pressure_alarm_ended")).toEqual(["auditor", "lead"]);

    const apart = await alarmsOf(far);
    expect(apart.map((alarm) => [alarm.startedAt, alarm.endedAt])).toEqual([
      [at(start, 3), at(start, 5)],
      [at(start, 8), at(start, 10)],
    ]);
    expect(topics(await mailsFor(far), "pressure_alarm_started")).toHaveLength(4);
  });

  it("when the door is open while the room is out of range for three minutes, then the door grace applies and nothing alarms; with the door shut it alarms", async () => {
    const start = newStart();
    const open = await insertMonitoredRoom(db(), { mappedAt: start });
    const shut = await insertMonitoredRoom(db(), { mappedAt: start });
    const pressure = negativeExcept([[4, 7]]);
    const door = (t: number) => (t >= 4 * 60 && t < 7 * 60 ? "open" : "closed");
    await play(
      open,
      timeline(open.monitorId, start, 12 * 60, 10, pressure, { door }),
      start,
      at(start, 12),
    );
    await play(
      shut,
      timeline(shut.monitorId, start, 12 * 60, 10, pressure, { door: () => "closed" }),
      start,
      at(start, 12),
    );
    expect(await alarmsOf(open)).toEqual([]);
    expect(await mailsFor(open)).toEqual([]);
    expect(await alarmsOf(shut)).toHaveLength(1);
  });

  it("when a monitor falls silent for 10 minutes, then a no-readings alarm starts, and ends when it reports again", async () => {
    const start = newStart();
    const room = await insertMonitoredRoom(db(), { mappedAt: start });
    const before = timeline(room.monitorId, start, 5 * 60, 10, () => -5);
    const after = timeline(room.monitorId, at(start, 25), 5 * 60, 10, () => -5);
    // The timer runs every 30 s without new readings.
    await play(room, [...before, ...after], start, at(start, 30));
    const last = before.at(-1)!.measuredAt;

    const [alarm] = await alarmsOf(room);
    expect(alarm).toMatchObject({
      kind: "no_readings",
      startedAt: last,
      alarmAt: new Date(last.getTime() + 10 * minute),
      endedAt: at(start, 25),
    });
    const mails = await mailsFor(room);
    expect(topics(mails, "pressure_alarm_started")).toEqual(["auditor", "lead"]);
    expect(topics(mails, "pressure_alarm_ended")).toEqual(["auditor", "lead"]);
    expect(mails[0]!.subject).toMatch(/^No pressure readings/);
  });

  it("when Lintel comes back after 30 minutes away and the broker's backlog is still arriving, then no room is called silent; a monitor really silent alarms 10 minutes after Lintel came back", async () => {
    const start = newStart();
    const room = await insertMonitoredRoom(db(), { mappedAt: start });
    // Live for 5 minutes; then Lintel is away from 5 to 35 while the broker keeps the readings.
    const live = timeline(room.monitorId, start, 5 * 60, 10, () => -5);
    await play(room, live, start, at(start, 5));
    const back = at(start, 35);
    const held = timeline(room.monitorId, at(start, 5), 30 * 60, 10, () => -5).slice(1);
    // The backlog arrives over the first 3 minutes back, a round after every part of it.
    const parts = 6;
    for (let part = 0; part < parts; part += 1) {
      const now = new Date(back.getTime() + part * 30_000);
      const arriving = held.slice((part * held.length) / parts, ((part + 1) * held.length) / parts);
      await storeReadings(db(), arriving, { source: "mqtt", now });
      await evaluatePressureAlarms(deps(), {
        now,
        monitorIds: [room.monitorId],
        listeningSince: back,
      });
    }
    expect(await alarmsOf(room)).toEqual([]);
    expect(await mailsFor(room)).toEqual([]);

    // Then the monitor really stops (its last reading at 35): the alarm comes at 45, from 35.
    for (const minutes of [44.5, 45]) {
      await evaluatePressureAlarms(deps(), {
        now: at(start, minutes),
        monitorIds: [room.monitorId],
        listeningSince: back,
      });
    }
    const [alarm] = await alarmsOf(room);
    expect(alarm).toMatchObject({ kind: "no_readings", startedAt: held.at(-1)!.measuredAt });
    expect(topics(await mailsFor(room), "pressure_alarm_started")).toEqual(["auditor", "lead"]);
  });

  it("when three rooms of a site fall silent together and report again together, then each has its alarm and each recipient gets one e-mail listing the rooms for each", async () => {
    const start = newStart();
    const room = await insertMonitoredRoom(db(), { mappedAt: start });
    const others = await Promise.all(
      [1, 2].map(async () => {
        const space = await insertSpace(db(), room.floor, "isolation_room");
        const [monitor] = await db()
          .insert(pressureMonitors)
          .values({
            monitorId: `h2-${space.id.slice(0, 8)}`,
            siteId: room.site.id,
            spaceId: space.id,
            createdAt: start,
          })
          .returning();
        return { ...monitor!, spaceName: space.name };
      }),
    );
    const ids = [room.monitorId, ...others.map((monitor) => monitor.monitorId)];
    // All three report for 5 minutes, say nothing for 20 (the gateway is down), then report.
    for (const id of ids) {
      const before = timeline(id, start, 5 * 60, 10, () => -5);
      const after = timeline(id, at(start, 25), 5 * 60, 10, () => -5);
      await storeReadings(db(), [...before, ...after], { source: "mqtt", now: at(start, 30) });
    }
    for (const minutes of [10, 16, 26]) {
      await evaluatePressureAlarms(deps(), { now: at(start, minutes), monitorIds: ids });
    }
    const alarms = await db()
      .select()
      .from(pressureAlarms)
      .where(eq(pressureAlarms.siteId, room.site.id));
    expect(alarms).toHaveLength(3);
    expect(alarms.every((alarm) => alarm.kind === "no_readings" && alarm.endedAt !== null)).toBe(
      true,
    );
    const mails = await mailsFor(room);
    expect(topics(mails, "pressure_alarm_started")).toEqual(["auditor", "lead"]);
    expect(topics(mails, "pressure_alarm_ended")).toEqual(["auditor", "lead"]);
    const started = mails.find((mail) => mail.topic === "pressure_alarm_started")!;
    expect(started.subject).toBe(`No pressure readings: 3 rooms, ${room.site.name}`);
    for (const name of [room.space.name, ...others.map((other) => other.spaceName)])
      expect(started.text).toContain(`${name}: no reading since`);
    const ended = mails.find((mail) => mail.topic === "pressure_alarm_ended")!;
    expect(ended.subject).toBe(`Pressure readings back: 3 rooms, ${room.site.name}`);
    expect(ended.text).toContain(`${others[0]!.spaceName}: reported again at`);
  });

  it("when an excursion passes the action limit, then it becomes a critical finding on room.pressure, and a second one joins the same unfinished action", async () => {
    const start = newStart();
    const room = await insertMonitoredRoom(db(), { mappedAt: start });
    const readings = timeline(
      room.monitorId,
      start,
      60 * 60,
      10,
      negativeExcept([
        [2, 20],
        [30, 48],
      ]),
    );
    await play(room, readings, start, at(start, 60), 60);

    const alarms = await alarmsOf(room);
    expect(alarms).toHaveLength(2);
    // Critical at start + 15 min, the default action limit.
    expect(alarms[0]).toMatchObject({ criticalAt: at(start, 17) });
    expect(alarms[1]).toMatchObject({ criticalAt: at(start, 45) });
    expect(alarms[0]!.actionId).not.toBeNull();
    expect(alarms[1]!.actionId).toBe(alarms[0]!.actionId);

    const actions = await db()
      .select()
      .from(correctiveActions)
      .where(eq(correctiveActions.spaceId, room.space.id));
    expect(actions).toHaveLength(1);
    expect(actions[0]).toMatchObject({
      itemKey: "room.pressure",
      severity: "critical",
      state: "to_fix",
      assigneeId: room.lead.id,
    });
    // The lead was told once that the action is theirs, and what opened it.
    const mails = await mailsFor(room);
    expect(topics(mails, "action_assigned")).toEqual(["lead"]);
    expect(mails.find((mail) => mail.topic === "action_assigned")!.text).toContain(
      "A room-pressure excursion longer than the site's action limit has opened a corrective action",
    );
  });

  it("when the site sets its own graces and action limit, then the alarm follows them", async () => {
    const start = newStart();
    const patient = await insertMonitoredRoom(db(), {
      mappedAt: start,
      settings: { graceSeconds: 300, doorGraceSeconds: 600 },
    });
    const strict = await insertMonitoredRoom(db(), {
      mappedAt: start,
      settings: { actionLimitMinutes: 5 },
    });
    // Three minutes out of range: past the default grace, short of a 5 minute one.
    await play(
      patient,
      timeline(patient.monitorId, start, 10 * 60, 10, negativeExcept([[2, 5]])),
      start,
      at(start, 10),
    );
    expect(await alarmsOf(patient)).toEqual([]);
    // Eight minutes out of range: past a 5 minute action limit.
    await play(
      strict,
      timeline(strict.monitorId, start, 15 * 60, 10, negativeExcept([[2, 10]])),
      start,
      at(start, 15),
      60,
    );
    const [alarm] = await alarmsOf(strict);
    expect(alarm).toMatchObject({ criticalAt: at(start, 7), endedAt: at(start, 10) });
    expect(alarm!.actionId).not.toBeNull();
  });

  it("when the monitor reports in inches of water, then −0.010 in. w.c. meets the threshold and −0.009 does not", async () => {
    const start = newStart();
    const room = await insertMonitoredRoom(db(), { mappedAt: start });
    const readings = timeline(
      room.monitorId,
      start,
      12 * 60,
      10,
      (t) => (t >= 3 * 60 && t < 6 * 60 ? -0.009 : -0.01),
      { unit: "inH2O" },
    );
    await play(room, readings, start, at(start, 12));
    const [alarm, ...rest] = await alarmsOf(room);
    expect(rest).toEqual([]);
    expect(alarm).toMatchObject({
      startedAt: at(start, 3),
      endedAt: at(start, 6),
      worstValue: -0.009,
      worstUnit: "inH2O",
    });
    const started = (await mailsFor(room)).find((mail) => mail.topic === "pressure_alarm_started")!;
    expect(started.text).toContain("−0.009 in. w.c.");
  });

  it("when the room's space is retired, then its open alarm ends at the retirement without an e-mail and its monitor raises no more", async () => {
    const start = newStart();
    const room = await insertMonitoredRoom(db(), { mappedAt: start });
    await play(
      room,
      timeline(room.monitorId, start, 6 * 60, 10, negativeExcept([[2, 6]])),
      start,
      at(start, 6),
    );
    expect(topics(await mailsFor(room), "pressure_alarm_started")).toEqual(["auditor", "lead"]);
    await db()
      .update(spaces)
      .set({ retiredAt: at(start, 7), retiredBy: room.admin.id })
      .where(eq(spaces.id, room.space.id));

    // Still out of range, then silent: nothing more.
    await play(
      room,
      timeline(room.monitorId, at(start, 6), 30 * 60, 10, () => 1),
      at(start, 6),
      at(start, 60),
      120,
    );
    const alarms = await alarmsOf(room);
    expect(alarms).toHaveLength(1);
    expect(alarms[0]).toMatchObject({ endedAt: at(start, 7), endMailedAt: null });
    const mails = await mailsFor(room);
    expect(mails).toHaveLength(2);
    expect(topics(mails, "pressure_alarm_ended")).toEqual([]);
    const actions = await db()
      .select()
      .from(correctiveActions)
      .where(and(eq(correctiveActions.spaceId, room.space.id)));
    expect(actions).toEqual([]);
  });

  it("when the site's administrator has chosen the recipients, then only they are told; a deactivated one is not", async () => {
    const start = newStart();
    const room = await insertMonitoredRoom(db(), { mappedAt: start });
    const gone = await insertUser(db(), room.network.id, { deactivatedAt: at(start, 0) });
    await insertGrant(db(), gone.id, "auditor", room.site.id);
    const { setPressureSettings } = await import("../../server/modules/pressure/settings.service");
    await setPressureSettings(
      db(),
      room.site.id,
      {
        graceSeconds: null,
        doorGraceSeconds: null,
        actionLimitMinutes: null,
        recipients: [room.admin.id],
      },
      { userId: room.admin.id, requestId: null },
    );
    await play(
      room,
      timeline(room.monitorId, start, 10 * 60, 10, negativeExcept([[2, 5]])),
      start,
      at(start, 10),
    );
    const mails = await mailsFor(room);
    expect(topics(mails, "pressure_alarm_started")).toEqual(["admin"]);
    expect(topics(mails, "pressure_alarm_ended")).toEqual(["admin"]);
  });
});
