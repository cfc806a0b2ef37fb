import type { ScheduleEntry } from "@shared/schemas/audits";
import { describe, expect, it } from "vitest";

import {
  type AnswerFields,
  criticalNotApplicableMessage,
  emptyAnswer,
  needsNote,
  outcomeFromEntry,
  resultOnPhone,
  reviewAudit,
} from "@/features/walkthroughs/lib/answer-rules";
import { describeDue, dueNow, orderByDue } from "@/features/walkthroughs/lib/due-order";
import {
  formatReading,
  fromStoredUnit,
  otherUnits,
  toStoredUnit,
} from "@/features/walkthroughs/lib/reading-units";
import { ventilationFigures } from "@/features/walkthroughs/lib/ventilation-figures";

import { buildItem, doffingItems, isolationItems } from "./support/audit-data";

const answer = (fields: Partial<AnswerFields>): AnswerFields => ({ ...emptyAnswer, ...fields });

describe("readings shown in the auditor's unit", () => {
  // 1 in. w.c. = 0.0254 m × 9.80665 m/s² × 1000 kg/m³ = 249.08891 Pa; 1 cfm = 0.3048³ m³ × 60 per hour.
  it("when a pressure of 2.5 Pa is shown in inches of water, then it reads 0.010 in. w.c. with a true minus sign", () => {
    expect(formatReading(fromStoredUnit(-2.5, "inH2O"), "inH2O")).toBe("\u22120.010 in. w.c.");
    expect(formatReading(-2.5, "Pa")).toBe("\u22122.5 Pa");
    expect(otherUnits(-2.5, "pressure", "Pa")).toEqual(["\u22120.010 in. w.c."]);
  });

  it("when a reading is entered in inches of water or cfm, then it is stored in Pa or m³/h", () => {
    expect(toStoredUnit(-0.01, "inH2O")).toBeCloseTo(-2.4908891, 6);
    expect(toStoredUnit(100, "cfm")).toBeCloseTo(169.9010796, 6);
    expect(fromStoredUnit(toStoredUnit(318, "cfm"), "cfm")).toBeCloseTo(318, 9);
    expect(formatReading(169.9010796, "m3/h")).toBe("170 m³/h");
    expect(formatReading(100, "cfm")).toBe("100 cfm");
  });

  it("when a reading rounds to zero, then no minus sign is left in front of it", () => {
    expect(formatReading(-0.01, "Pa")).toBe("0 Pa");
  });

  it("when a pressure limit of at most −2.5 Pa meets readings in either unit, then the same reading gets the same outcome", () => {
    const [pressure] = isolationItems();
    expect(outcomeFromEntry(pressure!, answer({ value: -3, unit: "Pa" }), null)).toBe("pass");
    expect(outcomeFromEntry(pressure!, answer({ value: -0.012, unit: "inH2O" }), null)).toBe(
      "pass",
    );
    expect(outcomeFromEntry(pressure!, answer({ value: -0.009, unit: "inH2O" }), null)).toBe(
      "fail",
    );
    // Exactly the limit, entered in inches of water, is not failed by rounding.
    expect(
      outcomeFromEntry(
        pressure!,
        answer({ value: fromStoredUnit(-2.5, "inH2O"), unit: "inH2O" }),
        null,
      ),
    ).toBe("pass");
  });

  it("when air changes have no limit of their own, then the room's construction class gives it", () => {
    const [, , airChanges] = isolationItems();
    const room = { volumeM3: 45, constructionClass: "existing" as const, minimumAirChanges: 6 };
    expect(outcomeFromEntry(airChanges!, answer({ value: 6, unit: "ach" }), room)).toBe("pass");
    expect(outcomeFromEntry(airChanges!, answer({ value: 5.9, unit: "ach" }), room)).toBe("fail");
  });

  it("when the airflow and the room volume are known, then air changes and clearance times follow", () => {
    const items = isolationItems();
    const figures = ventilationFigures(
      items,
      new Map([[items[1]!.id, answer({ outcome: "pass", value: 540, unit: "m3/h" })]]),
      { volumeM3: 45, constructionClass: "new_or_renovated", minimumAirChanges: 12 },
    );
    expect(figures.airChanges).toBeCloseTo(12, 9);
    expect(figures.minimumAirChanges).toBe(12);
    // CDC 2003 Appendix B, Table B.1: 12 ACH → 23 min to 99%, 35 min to 99.9%.
    expect(Math.round(figures.minutesTo99!)).toBe(23);
    expect(Math.round(figures.minutesTo999!)).toBe(35);
  });
});

describe("what stands between a draft and submitting it", () => {
  it("when a critical item is marked not applicable without a note, then a note is required; a minor one needs none", () => {
    const critical = buildItem({ severity: "critical" });
    const minor = buildItem({ severity: "minor" });
    expect(needsNote(critical, answer({ outcome: "not_applicable" }))).toBe(true);
    expect(needsNote(critical, answer({ outcome: "not_applicable", note: "  " }))).toBe(true);
    expect(needsNote(critical, answer({ outcome: "not_applicable", note: "Bay closed." }))).toBe(
      false,
    );
    expect(needsNote(minor, answer({ outcome: "not_applicable" }))).toBe(false);

    const review = reviewAudit(
      [critical],
      new Map([[critical.id, answer({ outcome: "not_applicable" })]]),
      new Map(),
    );
    expect(review.problems.map((problem) => problem.message)).toEqual([
      criticalNotApplicableMessage,
    ]);
    expect(review.ready).toBe(false);
  });

  it("when items are unanswered, then the review lists them in checklist order with their positions", () => {
    const items = doffingItems();
    const review = reviewAudit(
      items,
      new Map([
        [items[0]!.id, answer({ outcome: "pass" })],
        [items[2]!.id, answer({ outcome: "pass", choice: "mirror" })],
      ]),
      new Map(),
    );
    expect(review.unanswered.map((entry) => [entry.index, entry.item.text])).toEqual([
      [1, items[1]!.text],
      [3, items[3]!.text],
    ]);
  });

  it("when a failed item that needs a photo has none, then it is a problem until a photo is added", () => {
    const [chair] = doffingItems();
    const answers = new Map([[chair!.id, answer({ outcome: "fail" })]]);
    expect(reviewAudit([chair!], answers, new Map()).problems).toHaveLength(1);
    expect(reviewAudit([chair!], answers, new Map([[chair!.id, 1]])).ready).toBe(true);
  });

  it("when a critical item fails, then the verdict worked out on the phone is hold until fixed, scored over what applies", () => {
    const items = doffingItems();
    const answers = new Map([
      [items[0]!.id, answer({ outcome: "fail" })],
      [items[1]!.id, answer({ outcome: "pass", count: 2 })],
      [items[2]!.id, answer({ outcome: "pass", choice: "mirror" })],
      [items[3]!.id, answer({ outcome: "not_applicable" })],
    ]);
    // critical 5 failed, major 3 + 3 passed, minor not applicable: 6 / 11.
    expect(resultOnPhone("doffing_area", items, answers)).toEqual({
      verdict: "hold",
      reasons: [`Critical item failed: ${items[0]!.text}`],
      score: 6 / 11,
    });
  });
});

describe("the order of what is due", () => {
  const entry = (
    spaceName: string,
    state: ScheduleEntry["state"],
    dueAt: string,
  ): ScheduleEntry => ({
    spaceId: "a0000000-0000-4000-8000-000000000000",
    spaceName,
    zoneType: "doffing_area",
    floorId: "b0000000-0000-4000-8000-000000000000",
    floorName: "Ground floor",
    cadenceDays: 30,
    lastAuditAt: "2026-01-01T00:00:00.000Z",
    dueAt,
    state,
    verdict: null,
    lastAuditorName: null,
  });

  it("when spaces are overdue, due soon and up to date, then the overdue come first, longest overdue at the top", () => {
    const ordered = orderByDue([
      entry("Anteroom 1", "ok", "2026-05-01T00:00:00.000Z"),
      entry("Donning zone 1", "due_soon", "2026-03-05T00:00:00.000Z"),
      entry("Isolation room 2", "overdue", "2026-03-01T00:00:00.000Z"),
      entry("Doffing area 1", "overdue", "2026-02-01T00:00:00.000Z"),
    ]);
    expect(ordered.map((item) => item.spaceName)).toEqual([
      "Doffing area 1",
      "Isolation room 2",
      "Donning zone 1",
      "Anteroom 1",
    ]);
  });

  it("when only what is due now is asked for, then spaces that are up to date are left out", () => {
    const due = dueNow([
      entry("Anteroom 1", "ok", "2026-05-01T00:00:00.000Z"),
      entry("Doffing area 10", "overdue", "2026-02-01T00:00:00.000Z"),
      entry("Doffing area 2", "overdue", "2026-02-01T00:00:00.000Z"),
    ]);
    expect(due.map((item) => item.spaceName)).toEqual(["Doffing area 2", "Doffing area 10"]);
  });

  it("when a space is overdue, then its due line counts the days late", () => {
    const now = new Date("2026-03-04T00:00:00.000Z");
    expect(describeDue(entry("Doffing area 1", "overdue", "2026-03-01T00:00:00.000Z"), now)).toBe(
      "Overdue by 3 days",
    );
    expect(describeDue(entry("Doffing area 1", "due_soon", "2026-03-05T00:00:00.000Z"), now)).toBe(
      "Due in 1 day",
    );
  });
});
