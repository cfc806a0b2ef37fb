import { describe, expect, it } from "vitest";

import {
  daysToClose,
  defaultDuePolicy,
  dueAt,
  dueSoonApplies,
  formatInZone,
  isOverdue,
  reminderNumber,
  type DuePolicy,
} from "@shared/calc/due";

// The policy defaults (critical 24 hours, major 7 days, minor 30 days) are common practice, not a
// published rule. The clock changes checked below are published law:
// - EU summer time (Directive 2000/84/EC, art. 2–3, which the UK kept): begins 01:00 UTC on the
//   last Sunday of March, ends 01:00 UTC on the last Sunday of October. In 2026: 29 March and
//   25 October.
// - US daylight saving time (Energy Policy Act of 2005, §110, amending 15 U.S.C. 260a): begins
//   02:00 local on the second Sunday of March, ends 02:00 local on the first Sunday of November.
//   In 2026: 8 March and 1 November.
const at = (iso: string) => new Date(iso);
const hours = (from: Date, to: Date) => (to.getTime() - from.getTime()) / 3_600_000;

describe("due times", () => {
  it("when a critical item fails the day before the clocks go forward in London, then it is due 24 elapsed hours later, an hour later on the wall clock", () => {
    // Saturday 28 March 2026 10:00 GMT; summer time begins 29 March 01:00 UTC (Directive 2000/84/EC).
    const opened = at("2026-03-28T10:00:00Z");
    const due = dueAt(opened, "critical", defaultDuePolicy, "Europe/London");
    expect(due.toISOString()).toBe("2026-03-29T10:00:00.000Z");
    expect(hours(opened, due)).toBe(24);
    expect(formatInZone(due, "Europe/London")).toBe("Sun 29 Mar 2026, 11:00 BST");
  });

  it("when a major item fails before the clocks go forward in London, then it is due 7 calendar days later at the same local time, 167 hours on", () => {
    // Wednesday 25 March 2026 09:00 GMT → Wednesday 1 April 09:00 BST (Directive 2000/84/EC).
    const opened = at("2026-03-25T09:00:00Z");
    const due = dueAt(opened, "major", defaultDuePolicy, "Europe/London");
    expect(due.toISOString()).toBe("2026-04-01T08:00:00.000Z");
    expect(hours(opened, due)).toBe(167);
    expect(formatInZone(due, "Europe/London")).toBe("Wed 1 Apr 2026, 09:00 BST");
  });

  it("when a minor item fails before the clocks go back in London, then it is due 30 calendar days later at the same local time, 721 hours on", () => {
    // Saturday 10 October 2026 14:00 BST; summer time ends 25 October 01:00 UTC (Directive 2000/84/EC).
    const opened = at("2026-10-10T13:00:00Z");
    const due = dueAt(opened, "minor", defaultDuePolicy, "Europe/London");
    expect(due.toISOString()).toBe("2026-11-09T14:00:00.000Z");
    expect(hours(opened, due)).toBe(30 * 24 + 1);
    expect(formatInZone(due, "Europe/London")).toBe("Mon 9 Nov 2026, 14:00 GMT");
  });

  it("when the site is in New York, then its own clock change decides: 7 days across 8 March 2026 is 167 hours", () => {
    // Thursday 5 March 2026 09:00 EST → Thursday 12 March 09:00 EDT (Energy Policy Act of 2005, §110).
    const opened = at("2026-03-05T14:00:00Z");
    const newYork = dueAt(opened, "major", defaultDuePolicy, "America/New_York");
    expect(newYork.toISOString()).toBe("2026-03-12T13:00:00.000Z");
    expect(hours(opened, newYork)).toBe(167);
    // The same instant at a London site sees no clock change that week: exactly 168 hours.
    const london = dueAt(opened, "major", defaultDuePolicy, "Europe/London");
    expect(hours(opened, london)).toBe(168);
  });

  it("when the due local time does not exist (the clocks skip it), then it moves forward by the skipped hour", () => {
    // Sunday 22 March 2026 01:30 GMT + 7 days = 01:30 on 29 March, inside the skipped hour
    // 01:00–02:00 (Directive 2000/84/EC): the wall clock reads 02:30 BST, 168 elapsed hours.
    const opened = at("2026-03-22T01:30:00Z");
    const due = dueAt(opened, "major", defaultDuePolicy, "Europe/London");
    expect(due.toISOString()).toBe("2026-03-29T01:30:00.000Z");
    expect(formatInZone(due, "Europe/London")).toBe("Sun 29 Mar 2026, 02:30 BST");
  });

  it("when the due local time happens twice (the clocks go back), then the later one is taken, giving the full time", () => {
    // Sunday 18 October 2026 01:30 BST + 7 days = 01:30 on 25 October, which happens at 00:30 UTC
    // (BST) and again at 01:30 UTC (GMT) (Directive 2000/84/EC).
    const opened = at("2026-10-18T00:30:00Z");
    const due = dueAt(opened, "major", defaultDuePolicy, "Europe/London");
    expect(due.toISOString()).toBe("2026-10-25T01:30:00.000Z");
    expect(hours(opened, due)).toBe(169);
  });

  it("when 30 days run past the end of a short month, then the calendar decides (2026 is not a leap year, 2028 is)", () => {
    // Gregorian calendar: February has 28 days in 2026 and 29 in 2028.
    expect(
      dueAt(at("2026-01-31T12:00:00Z"), "minor", defaultDuePolicy, "Europe/London").toISOString(),
    ).toBe("2026-03-02T12:00:00.000Z");
    expect(
      dueAt(at("2028-01-31T12:00:00Z"), "minor", defaultDuePolicy, "Europe/London").toISOString(),
    ).toBe("2028-03-01T12:00:00.000Z");
    // Across the year end.
    expect(
      dueAt(at("2026-12-15T08:00:00Z"), "minor", defaultDuePolicy, "Europe/London").toISOString(),
    ).toBe("2027-01-14T08:00:00.000Z");
  });

  it("when 24 hours start late on a month's last evening in the site's zone, then the due day is the next month's", () => {
    // 30 April 2026 23:30 BST is 22:30 UTC; due 1 May 23:30 BST.
    const due = dueAt(at("2026-04-30T22:30:00Z"), "critical", defaultDuePolicy, "Europe/London");
    expect(formatInZone(due, "Europe/London")).toBe("Fri 1 May 2026, 23:30 BST");
  });

  it("when a site's policy counts critical items in days, then the calendar rule applies to them too", () => {
    const policy: DuePolicy = { ...defaultDuePolicy, critical: { amount: 1, unit: "days" } };
    const opened = at("2026-03-28T10:00:00Z");
    const due = dueAt(opened, "critical", policy, "Europe/London");
    // Same local time (10:00 GMT → 10:00 BST) is 23 elapsed hours (Directive 2000/84/EC).
    expect(hours(opened, due)).toBe(23);
  });

  it("when the policy or the date is not usable, then a RangeError says so", () => {
    const opened = at("2026-03-28T10:00:00Z");
    for (const amount of [0, -1, 1.5, 366]) {
      expect(() =>
        dueAt(
          opened,
          "minor",
          { ...defaultDuePolicy, minor: { amount, unit: "days" } },
          "Europe/London",
        ),
      ).toThrow(RangeError);
    }
    expect(() => dueAt(new Date("nonsense"), "minor", defaultDuePolicy, "Europe/London")).toThrow(
      RangeError,
    );
  });
});

describe("time-based notices", () => {
  const opened = at("2026-03-25T09:00:00Z");
  const due = at("2026-04-01T08:00:00Z");

  it("when inside the last day before due, then the due-soon notice applies, not before and not after", () => {
    expect(dueSoonApplies(opened, due, at("2026-03-31T07:59:00Z"))).toBe(false);
    expect(dueSoonApplies(opened, due, at("2026-03-31T08:00:00Z"))).toBe(true);
    expect(dueSoonApplies(opened, due, at("2026-04-01T08:00:00Z"))).toBe(true);
    expect(dueSoonApplies(opened, due, at("2026-04-01T08:00:01Z"))).toBe(false);
  });

  it("when an action is due within a day of opening, then no separate due-soon notice is sent", () => {
    const criticalOpened = at("2026-03-28T10:00:00Z");
    const criticalDue = at("2026-03-29T10:00:00Z");
    expect(dueSoonApplies(criticalOpened, criticalDue, at("2026-03-29T09:00:00Z"))).toBe(false);
  });

  it("when past due and not done, then overdue; a done action never is", () => {
    expect(isOverdue(due, at("2026-04-01T08:00:00Z"), false)).toBe(false);
    expect(isOverdue(due, at("2026-04-01T08:00:01Z"), false)).toBe(true);
    expect(isOverdue(due, at("2026-05-01T00:00:00Z"), true)).toBe(false);
  });

  it("when weeks pass after the overdue notice, then the reminder number is the whole weeks elapsed", () => {
    const notice = at("2026-04-01T08:05:00Z");
    expect(reminderNumber(notice, at("2026-04-08T08:04:59Z"))).toBe(0);
    expect(reminderNumber(notice, at("2026-04-08T08:05:00Z"))).toBe(1);
    // After downtime, the latest reminder only: five weeks on is reminder 5.
    expect(reminderNumber(notice, at("2026-05-07T09:00:00Z"))).toBe(5);
  });

  it("when an action closes, then days to close are elapsed days to one decimal", () => {
    expect(daysToClose(at("2026-03-25T09:00:00Z"), at("2026-03-28T21:00:00Z"))).toBe(3.5);
    expect(daysToClose(at("2026-03-25T09:00:00Z"), at("2026-03-25T09:00:00Z"))).toBe(0);
    expect(() => daysToClose(at("2026-03-25T09:00:00Z"), at("2026-03-24T09:00:00Z"))).toThrow(
      RangeError,
    );
  });
});
