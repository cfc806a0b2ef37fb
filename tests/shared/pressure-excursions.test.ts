import { describe, expect, it } from "vitest";

import {
  analysePressure,
  defaultExcursionPolicy,
  excursionPolicy,
  orderReadings,
  rollUp,
  rollUpHours,
  rollUpMinutes,
  type PressureSample,
} from "@shared/calc/pressure-excursions";
import { pascalsPerInchOfWater } from "@shared/calc/ventilation";

/*
 * Hand-worked timelines. Times are seconds after 10:00:00 UTC; the defaults are a 60 s grace,
 * a 5 min (300 s) door grace, excursions less than 120 s apart joined, a 15 min (900 s) action
 * limit and a 10 min (600 s) silence. A room is out of range when its reading is above −2.5 Pa
 * (less negative). Between two readings the room stays as the earlier one showed.
 */
const t0 = Date.UTC(2026, 11, 3, 10, 0, 0);
const at = (seconds: number) => new Date(t0 + seconds * 1000);
const monitorId = "AIIR-204";

function reading(
  seconds: number,
  pressure: number,
  door: "open" | "closed" | null = null,
  unit: "Pa" | "inH2O" = "Pa",
): PressureSample {
  return { monitorId, measuredAt: at(seconds), pressure, unit, door };
}

/** A reading every `step` seconds from `from` to `to` inclusive, all at `pressure`. */
function every(
  from: number,
  to: number,
  pressure: number,
  door: "open" | "closed" | null = null,
  step = 10,
): PressureSample[] {
  const list: PressureSample[] = [];
  for (let s = from; s <= to; s += step) list.push(reading(s, pressure, door));
  return list;
}

const IN = -4; // in range: below −2.5 Pa
const OUT = -1; // out of range

describe("the default threshold", () => {
  // CDC, Guidelines for Preventing the Transmission of Mycobacterium tuberculosis in Health-Care
  // Settings, MMWR 2005;54(RR-17), and the CDC 2003 environmental guideline: at least 0.01 in.
  // water gauge (2.5 Pa) negative to the corridor (references §2).
  it("when nothing is set for the room, then it is at least 2.5 Pa negative, judged at the CDC figure in each unit", () => {
    expect(defaultExcursionPolicy.threshold).toEqual({ op: "<=", value: -2.5 });
    const judge = (pressure: number, unit: "Pa" | "inH2O") =>
      analysePressure([reading(0, pressure, null, unit), reading(70, IN)], at(70)).excursions
        .length;
    // 0 s out of range → 70 s back in range: 70 s > 60 s grace, an excursion, only when out.
    expect(judge(-2.5, "Pa")).toBe(0); // −2.5 Pa meets "≤ −2.5 Pa"
    expect(judge(-2.4, "Pa")).toBe(1);
    expect(judge(-0.01, "inH2O")).toBe(0); // −0.010 in. w.c. = 2.49 Pa, still meets: CDC's figure in inches
    expect(judge(-0.009, "inH2O")).toBe(1);
  });

  it("when the defaults are read, then grace 60 s, action limit 15 min, silence 10 min, merge gap 2 min, door grace 5 min", () => {
    expect(defaultExcursionPolicy).toMatchObject({
      graceMs: 60_000,
      actionLimitMs: 900_000,
      silenceMs: 600_000,
      mergeGapMs: 120_000,
      doorGraceMs: 300_000, // a Lintel default (common practice, no published figure)
    });
  });

  it("when a door grace shorter than the grace is asked for, then the policy is refused", () => {
    expect(() => excursionPolicy({ doorGraceMs: 30_000 })).toThrow(/door grace/);
    expect(() => excursionPolicy({ graceMs: Number.NaN })).toThrow(/graceMs/);
    expect(excursionPolicy({ graceMs: 30_000 }).graceMs).toBe(30_000);
  });
});

describe("the grace period", () => {
  it("when the room is out of range for exactly the grace, then there is no excursion", () => {
    // Out at 60..110 (6 readings), back in at 120: out of range [60, 120) = 60 s, not longer.
    const readings = [...every(0, 50, IN), ...every(60, 110, OUT), ...every(120, 200, IN)];
    const result = analysePressure(readings, at(200));
    expect(result.excursions).toEqual([]);
    expect(result.now).toBe("in_range");
  });

  it("when the room is out of range for longer than the grace, then one excursion with its start, end, duration and worst reading", () => {
    // Out at 60..120 with values −1, −0.5, +0.8, +0.2, −1.5, −2.0, −2.4; in at 130.
    // Out of range [60, 130) = 70 s > 60 s: start 60, the grace runs out at 60 + 60 = 120,
    // end 130, duration 70 s, worst +0.8 Pa at 80 (furthest above −2.5 Pa).
    const out = [-1, -0.5, 0.8, 0.2, -1.5, -2.0, -2.4].map((p, i) => reading(60 + 10 * i, p));
    const readings = [...every(0, 50, IN), ...out, ...every(130, 400, IN)];

    const closing = analysePressure(readings, at(200));
    expect(closing.excursions).toHaveLength(1);
    const [excursion] = closing.excursions;
    expect(excursion).toMatchObject({
      monitorId,
      start: at(60),
      alarmAt: at(120),
      end: at(130),
      endedBy: "recovered",
      lastOutAt: at(120),
      durationMs: 70_000,
      worst: { measuredAt: at(80), pressure: 0.8, unit: "Pa", pascals: 0.8 },
      critical: false,
      criticalAt: null,
    });
    // At 200, 70 s after the end: another excursion starting before 130 + 120 = 250 would join.
    expect(excursion!.status).toBe("closing");
    // At 250 nothing can join any more.
    expect(analysePressure(readings, at(250)).excursions[0]!.status).toBe("closed");
  });

  it("when readings out of range go on and the clock runs, then the excursion is open from the moment the grace is passed", () => {
    // Out at 0..50, clock 55: 50 s known, within the grace → out of range, no excursion.
    const early = analysePressure(every(0, 50, OUT), at(55));
    expect(early.excursions).toEqual([]);
    expect(early.now).toBe("out_of_range");
    // Out at 0..60: 60 s, still not longer than the grace.
    expect(analysePressure(every(0, 60, OUT), at(65)).excursions).toEqual([]);
    // Out at 0..70: 70 s > 60 s → open since 0, alarm at 60, duration 70 s so far, no end.
    const open = analysePressure(every(0, 70, OUT), at(75));
    expect(open.now).toBe("excursion");
    expect(open.excursions).toEqual([
      expect.objectContaining({
        start: at(0),
        alarmAt: at(60),
        end: null,
        endedBy: null,
        status: "open",
        durationMs: 70_000,
      }),
    ]);
  });
});

describe("the door grace", () => {
  it("when the door reports open the whole time and the room recovers within the door grace, then there is no excursion", () => {
    // Out with the door open at 0..240, in and closed at 250: 250 s out, all with the door
    // open (no closed time against the 60 s grace), 250 s ≤ 300 s door grace.
    const readings = [...every(0, 240, OUT, "open"), reading(250, IN, "closed")];
    expect(analysePressure(readings, at(260)).excursions).toEqual([]);
  });

  it("when the door is propped open past the door grace, then an excursion from the first reading out, alarmed at 5 minutes", () => {
    // Out with the door open at 0..300, in at 310: 310 s > 300 s → alarm at 0 + 300.
    const readings = [...every(0, 300, OUT, "open"), reading(310, IN, "closed")];
    const [excursion, ...rest] = analysePressure(readings, at(320)).excursions;
    expect(rest).toEqual([]);
    expect(excursion).toMatchObject({
      start: at(0),
      alarmAt: at(300),
      end: at(310),
      durationMs: 310_000,
    });
  });

  it("when the door shuts and the room stays out of range, then the ordinary grace runs from the door shutting", () => {
    // Out with the door open at 0..100 (the intervals [0, 110) count as open), out with the door
    // closed at 110..170 (closed time [110, 180) = 70 s > 60 s), in at 180.
    // The grace runs out at 110 + 60 = 170; the door grace (180 s in all ≤ 300) never does.
    const readings = [
      ...every(0, 100, OUT, "open"),
      ...every(110, 170, OUT, "closed"),
      reading(180, IN, "closed"),
    ];
    expect(analysePressure(readings, at(200)).excursions).toEqual([
      expect.objectContaining({
        start: at(0),
        alarmAt: at(170),
        end: at(180),
        durationMs: 180_000,
      }),
    ]);
  });

  it("when the door was closed for part of the stretch before it opened, then that time counts against the ordinary grace", () => {
    // Closed and out at 0..30 ([0, 40) = 40 s closed), open and out at 40..130, closed and out
    // at 140..150 ([140, 160) = 20 s closed), in at 160: 60 s closed, not longer; 160 s ≤ 300.
    const base = [
      ...every(0, 30, OUT, "closed"),
      ...every(40, 130, OUT, "open"),
      ...every(140, 150, OUT, "closed"),
    ];
    expect(analysePressure([...base, reading(160, IN)], at(170)).excursions).toEqual([]);
    // One more closed reading out at 160, in at 170: 70 s closed → alarm at 140 + 20 = 160.
    const longer = [...base, reading(160, OUT, "closed"), reading(170, IN)];
    expect(analysePressure(longer, at(180)).excursions).toEqual([
      expect.objectContaining({ start: at(0), alarmAt: at(160), end: at(170) }),
    ]);
  });

  it("when a long interval between readings has the door open, then none of it counts against the ordinary grace", () => {
    // Closed and out at 0..40 ([0, 50) = 50 s closed), open and out at 50 and at 100
    // ([50, 110) = 60 s open), in at 110: 50 s closed ≤ 60, 110 s in all ≤ 300 → none.
    const readings = [
      ...every(0, 40, OUT, "closed"),
      reading(50, OUT, "open"),
      reading(100, OUT, "open"),
      reading(110, IN, "closed"),
    ];
    expect(analysePressure(readings, at(120)).excursions).toEqual([]);
  });
});

describe("merging", () => {
  // A: out at 0..70, in at 80 → [0, 80), 80 s > 60 s, alarm at 60.
  const first = [...every(0, 70, OUT), ...every(80, 170, IN)];

  it("when a second excursion starts less than 2 minutes after the first ended, then they are one, with the worst of both and of the blip between", () => {
    // B: out at 180..260 (one reading at +1 Pa at 200), in at 270 → [180, 270), 90 s.
    // B starts 180 − 80 = 100 s after A ended: < 120 s → one excursion [0, 270], 270 s.
    // A 10 s blip at 120 (+5 Pa, in again at 130) is too short to be an excursion of its own
    // but lies inside the joined one, so it is the worst reading.
    const readings = [
      ...first.filter((r) => r.measuredAt.getTime() !== at(120).getTime()),
      reading(120, 5),
      ...every(180, 260, OUT).map((r) =>
        r.measuredAt.getTime() === at(200).getTime() ? reading(200, 1) : r,
      ),
      ...every(270, 500, IN),
    ];
    const { excursions } = analysePressure(readings, at(500));
    expect(excursions).toHaveLength(1);
    expect(excursions[0]).toMatchObject({
      start: at(0),
      alarmAt: at(60),
      end: at(270),
      durationMs: 270_000,
      status: "closed",
      worst: { measuredAt: at(120), pressure: 5 },
    });
  });

  it("when the second starts 2 minutes or more after the first ended, then they are two", () => {
    // B: out at 200..280, in at 290: 200 − 80 = 120 s, not less than 120 → two excursions.
    const readings = [...first, ...every(180, 190, IN), ...every(200, 280, OUT), reading(290, IN)];
    const { excursions } = analysePressure(readings, at(600));
    expect(excursions.map((e) => [e.start, e.end, e.durationMs])).toEqual([
      [at(0), at(80), 80_000],
      [at(200), at(290), 90_000],
    ]);
  });

  it("when a stretch began within the merge gap but has not yet passed its grace, then the first stays closing", () => {
    // A ended at 80; out again from 180 (100 s later), clock 230: the new stretch is 50 s old,
    // short of its grace, but could still join A → A is not yet closed though 230 > 80 + 120.
    const readings = [...first, ...every(180, 230, OUT)];
    const { excursions, now } = analysePressure(readings, at(230));
    expect(excursions).toHaveLength(1);
    expect(excursions[0]!.status).toBe("closing");
    expect(now).toBe("out_of_range");
    // At 250 the new stretch is 70 s old: it joins A, which is open again from 0.
    const joined = analysePressure([...readings, ...every(240, 250, OUT)], at(250));
    expect(joined.excursions).toEqual([
      expect.objectContaining({ start: at(0), end: null, status: "open", durationMs: 250_000 }),
    ]);
    expect(joined.now).toBe("excursion");
  });
});

describe("gaps and a monitor that stops", () => {
  it("when readings pause for less than the silence, then the room is taken to stay out of range through the gap", () => {
    // Out at 0 and at 300 (300 s apart, < 600 s), in at 310: [0, 310) out, alarm at 60.
    const readings = [reading(0, OUT), reading(300, OUT), reading(310, IN)];
    expect(analysePressure(readings, at(320)).excursions).toEqual([
      expect.objectContaining({ start: at(0), alarmAt: at(60), end: at(310), durationMs: 310_000 }),
    ]);
  });

  it("when the monitor falls silent while out of range within the grace, then no excursion, a silence, and nothing carried across it", () => {
    // Out at 0..50, nothing until 700 (650 s ≥ 600 s), in at 700: the stretch ends at 50 with
    // the readings (50 s, within the grace); the silence runs from 50 to 700.
    const readings = [...every(0, 50, OUT), reading(700, IN)];
    const result = analysePressure(readings, at(710));
    expect(result.excursions).toEqual([]);
    expect(result.silences).toEqual([{ from: at(50), to: at(700) }]);
    expect(result.now).toBe("in_range");
  });

  it("when the monitor falls silent during an excursion and comes back out of range, then two excursions, the first ended by the silence", () => {
    // Out at 0..120: 120 s, alarm at 60. Silent 120 → 800 (680 s). Out at 800..890, in at 900.
    // A: [0, 120] ended by readings stopping, 120 s. B: [800, 900), alarm 860, 100 s.
    // 800 − 120 = 680 s ≥ 120 s: not joined.
    const readings = [...every(0, 120, OUT), ...every(800, 890, OUT), reading(900, IN)];
    const result = analysePressure(readings, at(1200));
    expect(
      result.excursions.map((e) => [e.start, e.alarmAt, e.end, e.endedBy, e.durationMs]),
    ).toEqual([
      [at(0), at(60), at(120), "readings_stopped", 120_000],
      [at(800), at(860), at(900), "recovered", 100_000],
    ]);
    expect(result.silences).toEqual([{ from: at(120), to: at(800) }]);
  });

  it("when the monitor stops reporting, then a no-readings alarm from its last reading once 10 minutes have passed", () => {
    // In range at 0..300 every 10 s; last reading 300.
    const readings = every(0, 300, IN);
    // Clock 899: 599 s of silence, under 600 → still in range.
    const before = analysePressure(readings, at(899));
    expect(before.now).toBe("in_range");
    expect(before.noReadingsSince).toBeNull();
    // Clock 900: 600 s → no readings since 300.
    const after = analysePressure(readings, at(900));
    expect(after.now).toBe("no_readings");
    expect(after.noReadingsSince).toEqual(at(300));
    expect(after.silences).toEqual([{ from: at(300), to: null }]);
    expect(after.lastReading?.measuredAt).toEqual(at(300));
  });

  it("when the monitor stops while the room is in excursion, then the excursion ends at its last reading and the no-readings alarm takes over", () => {
    // Out at 0..200. Clock 700: 500 s since 200 → still open, 200 s known.
    const readings = every(0, 200, OUT);
    const open = analysePressure(readings, at(700));
    expect(open.excursions).toEqual([
      expect.objectContaining({ status: "open", end: null, durationMs: 200_000 }),
    ]);
    expect(open.now).toBe("excursion");
    // Clock 800: 600 s since 200 → ended by readings stopping at 200 (closed: 800 ≥ 200 + 120);
    // no readings since 200.
    const stopped = analysePressure(readings, at(800));
    expect(stopped.excursions).toEqual([
      expect.objectContaining({
        end: at(200),
        endedBy: "readings_stopped",
        status: "closed",
        durationMs: 200_000,
      }),
    ]);
    expect(stopped.now).toBe("no_readings");
    expect(stopped.noReadingsSince).toEqual(at(200));
  });

  it("when Lintel began listening again lately (a restart, its database or broker back), then an old last reading is not a silence until 10 minutes after that; the alarm then runs from the last reading", () => {
    // Last stored reading at 300; Lintel was away and began listening again at 1200.
    const readings = every(0, 300, IN);
    const options = { listeningSince: at(1200) };
    // Clock 1799: 599 s since listening began → no alarm (without the option: silent since 900).
    expect(analysePressure(readings, at(1799)).now).toBe("no_readings");
    const early = analysePressure(readings, at(1799), defaultExcursionPolicy, options);
    expect(early.now).toBe("in_range");
    expect(early.silences).toEqual([]);
    // Clock 1800: 600 s since listening began and still nothing → silent since the last reading.
    const late = analysePressure(readings, at(1800), defaultExcursionPolicy, options);
    expect(late.now).toBe("no_readings");
    expect(late.noReadingsSince).toEqual(at(300));
    // Listening that began after the clock (a skewed clock) changes nothing.
    expect(
      analysePressure(readings, at(900), defaultExcursionPolicy, { listeningSince: at(1000) }).now,
    ).toBe("no_readings");
  });

  it("when an excursion is open and Lintel began listening again lately, then it is not ended by the silence; the backlog arriving carries it on", () => {
    // Out of range 0..200; listening began again at 700; clock 1000 (800 s since the last).
    const options = { listeningSince: at(700) };
    const waiting = analysePressure(every(0, 200, OUT), at(1000), defaultExcursionPolicy, options);
    expect(waiting.excursions).toEqual([expect.objectContaining({ status: "open", end: null })]);
    expect(waiting.now).toBe("excursion");
    // The backlog arrives: out of range every 10 s to 400, back in range at 410.
    const backlog = [...every(0, 400, OUT), reading(410, IN)];
    const after = analysePressure(backlog, at(1000), defaultExcursionPolicy, options);
    expect(after.excursions).toEqual([
      expect.objectContaining({ end: at(410), endedBy: "recovered", durationMs: 410_000 }),
    ]);
  });

  it("when the backlog itself has a gap of 10 minutes, then that gap is a silence whatever listening says", () => {
    const readings = [...every(0, 100, IN), ...every(800, 900, IN)];
    const options = { listeningSince: at(950) };
    const analysis = analysePressure(readings, at(1000), defaultExcursionPolicy, options);
    expect(analysis.silences).toEqual([{ from: at(100), to: at(800) }]);
    expect(analysis.now).toBe("in_range");
  });

  it("when a mapped monitor has never reported, then it is silent from when it was mapped, once 10 minutes have passed", () => {
    const options = { watchingSince: at(0) };
    expect(analysePressure([], at(599), defaultExcursionPolicy, options).now).toBe(
      "never_reported",
    );
    const silent = analysePressure([], at(600), defaultExcursionPolicy, options);
    expect(silent.now).toBe("no_readings");
    expect(silent.noReadingsSince).toEqual(at(0));
    expect(silent.monitorId).toBeNull();
    expect(silent.lastReading).toBeNull();
  });
});

describe("out-of-order and repeated readings", () => {
  // The merged timeline: A out 0..70, in 80..170, B out 180..260, in 270..400.
  const timeline = [
    ...every(0, 70, OUT),
    ...every(80, 170, IN),
    ...every(180, 260, OUT),
    ...every(270, 400, IN),
  ];

  it("when the same readings arrive shuffled and some twice, then the answer is the same as in time order", () => {
    // A fixed shuffle: odd positions backwards, then even positions; every fifth reading twice.
    const odd = timeline.filter((_, i) => i % 2 === 1).reverse();
    const even = timeline.filter((_, i) => i % 2 === 0);
    const again = timeline.filter((_, i) => i % 5 === 0).map((r) => ({ ...r }));
    const shuffled = [...odd, ...again, ...even];
    expect(shuffled).toHaveLength(timeline.length + again.length);
    const inOrder = analysePressure(timeline, at(500));
    expect(analysePressure(shuffled, at(500))).toEqual(inOrder);
    // One excursion [0, 270]: B starts 100 s after A ends.
    expect(inOrder.excursions.map((e) => [e.start, e.end])).toEqual([[at(0), at(270)]]);
    expect(orderReadings(shuffled)).toEqual(timeline);
  });

  it("when two readings carry the same monitor and time with different values, then the first received is kept, as the storage keeps it", () => {
    const kept = orderReadings([reading(0, IN), reading(0, 3)]);
    expect(kept).toEqual([reading(0, IN)]);
  });

  it("when readings are dated after the clock, then they are not known yet", () => {
    // The answer at 100 is the same with or without the readings after 100.
    const whole = analysePressure(timeline, at(100));
    const known = analysePressure(
      timeline.filter((r) => r.measuredAt <= at(100)),
      at(100),
    );
    expect(whole).toEqual(known);
    expect(whole.lastReading?.measuredAt).toEqual(at(100));
  });

  it("when readings of two monitors are mixed, then the analysis refuses them", () => {
    expect(() =>
      analysePressure([reading(0, IN), { ...reading(10, IN), monitorId: "AIIR-205" }], at(20)),
    ).toThrow(/one monitor/);
  });
});

describe("the action limit", () => {
  it("when an excursion lasts longer than 15 minutes, then it is critical from start + 15 minutes", () => {
    // Out at 0..900 every 10 s, in at 910: 910 s > 900 s → critical at 900.
    const readings = [...every(0, 900, OUT), reading(910, IN)];
    expect(analysePressure(readings, at(1200)).excursions).toEqual([
      expect.objectContaining({ durationMs: 910_000, critical: true, criticalAt: at(900) }),
    ]);
  });

  it("when it lasts exactly 15 minutes, then it is not critical", () => {
    // Out at 0..890, in at 900: 900 s, not longer than 900 s.
    const readings = [...every(0, 890, OUT), reading(900, IN)];
    expect(analysePressure(readings, at(1200)).excursions).toEqual([
      expect.objectContaining({ durationMs: 900_000, critical: false, criticalAt: null }),
    ]);
  });

  it("when an open excursion passes the limit, then it is critical while still open; a site's own limit applies", () => {
    // Out at 0..910, clock 915: open, 910 s known.
    const open = analysePressure(every(0, 910, OUT), at(915)).excursions[0]!;
    expect(open).toMatchObject({ status: "open", critical: true, criticalAt: at(900) });
    // A 10-minute limit: out at 0..610, clock 615 → 610 s > 600 s, critical at 600.
    const policy = excursionPolicy({ actionLimitMs: 600_000 });
    const early = analysePressure(every(0, 610, OUT), at(615), policy).excursions[0]!;
    expect(early).toMatchObject({ critical: true, criticalAt: at(600) });
  });

  it("when two excursions are joined, then the limit applies to the joined duration", () => {
    // A: out 0..590, in 600 (600 s). B: out 700..850, in 860 → joined [0, 860], 860 s.
    // Neither alone passes a 700 s limit; joined they do, critical at 700.
    const readings = [
      ...every(0, 590, OUT),
      ...every(600, 690, IN),
      ...every(700, 850, OUT),
      reading(860, IN),
    ];
    const policy = excursionPolicy({ actionLimitMs: 700_000 });
    expect(analysePressure(readings, at(1200), policy).excursions).toEqual([
      expect.objectContaining({ durationMs: 860_000, critical: true, criticalAt: at(700) }),
    ]);
  });
});

describe("a monitor reporting in inches of water", () => {
  it("when it reports in in. w.c., then the worst reading keeps its unit and gives its Pa", () => {
    // −0.005 in. w.c. at 0..60, −0.003 at 70, −0.02 (in range) at 80: 80 s out, worst −0.003.
    const readings = [
      ...every(0, 60, -0.005).map((r) => ({ ...r, unit: "inH2O" as const })),
      reading(70, -0.003, null, "inH2O"),
      reading(80, -0.02, null, "inH2O"),
    ];
    const [excursion] = analysePressure(readings, at(100)).excursions;
    expect(excursion?.durationMs).toBe(80_000);
    expect(excursion?.worst.pressure).toBe(-0.003);
    expect(excursion?.worst.unit).toBe("inH2O");
    // 1 in. w.c. = 249.08891 Pa (references §2, NIST SP 811 conventional inch of water).
    expect(excursion?.worst.pascals).toBeCloseTo(-0.003 * 249.08891, 6);
    expect(pascalsPerInchOfWater).toBeCloseTo(249.08891, 5);
  });
});

describe("roll-ups", () => {
  const other = "AIIR-205";
  const readings: PressureSample[] = [
    reading(5, -3), // 10:00:05
    reading(35, -1), // 10:00:35, out of range
    reading(35, -1), // a repeat, kept once
    reading(70, -5), // 10:01:10
    { ...reading(3605, -0.01, null, "inH2O") }, // 11:00:05, −2.4909 Pa, in range (CDC figure in inches)
    { ...reading(20, -6), monitorId: other },
  ];

  it("when readings are rolled up by minute, then count, mean, min, max and the share out of range per monitor and minute", () => {
    // 10:00 for AIIR-204: −3 and −1 → count 2, sum −4, mean −2, min −3, max −1, 1 of 2 out → 0.5 min.
    // 10:01: −5 alone. 11:00: −0.01 in. w.c. = −2.4908891 Pa, in range.
    const minutes = rollUpMinutes(readings);
    expect(minutes.map((b) => [b.monitorId, b.bucketStart.toISOString(), b.count])).toEqual([
      [monitorId, "2026-12-03T10:00:00.000Z", 2],
      [monitorId, "2026-12-03T10:01:00.000Z", 1],
      [monitorId, "2026-12-03T11:00:00.000Z", 1],
      [other, "2026-12-03T10:00:00.000Z", 1],
    ]);
    expect(minutes[0]).toMatchObject({
      sumPascals: -4,
      meanPascals: -2,
      minPascals: -3,
      maxPascals: -1,
      outOfRangeCount: 1,
      minutesOutOfRange: 0.5,
      minutesWithReadings: 1,
    });
    expect(minutes[2]!.meanPascals).toBeCloseTo(-2.4908891, 6);
    expect(minutes[2]!.outOfRangeCount).toBe(0);
  });

  it("when rolled up by hour, then the hour is the sum of its minutes and its mean is the raw readings' mean", () => {
    // 10:00–11:00 for AIIR-204: −3, −1, −5 → count 3, mean −3, min −5, max −1; 0.5 + 0 = 0.5
    // minutes out of range; 2 minutes with readings.
    const hours = rollUp(readings, "hour");
    const tenOClock = hours.find(
      (b) => b.monitorId === monitorId && b.bucketStart.getTime() === at(0).getTime(),
    )!;
    expect(tenOClock).toMatchObject({
      count: 3,
      sumPascals: -9,
      meanPascals: -3,
      minPascals: -5,
      maxPascals: -1,
      outOfRangeCount: 1,
      minutesOutOfRange: 0.5,
      minutesWithReadings: 2,
    });
    expect(hours).toEqual(rollUpHours(rollUpMinutes(readings)));
    expect(hours).toHaveLength(3);
  });

  it("when readings arrive out of order with repeats, then the roll-ups are the same", () => {
    const shuffled = [...readings].reverse().concat(readings.slice(0, 2));
    expect(rollUp(shuffled, "minute")).toEqual(rollUp(readings, "minute"));
    expect(rollUp(shuffled, "hour")).toEqual(rollUp(readings, "hour"));
  });

  it("when a room has a threshold of its own, then minutes out of range follow it", () => {
    // At −4 Pa: −3, −1 out in 10:00 (1 minute), −5 in range in 10:01.
    const minutes = rollUpMinutes(readings, { op: "<=", value: -4 });
    expect(minutes[0]!.minutesOutOfRange).toBe(1);
    expect(minutes[1]!.minutesOutOfRange).toBe(0);
  });
});
