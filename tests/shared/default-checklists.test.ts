import { describe, expect, it } from "vitest";

import { categoryOfItem } from "@shared/checklists/categories";
import {
  commonPractice,
  defaultChecklists,
  notApplicableNeedsNote,
  requiredIsolationRoomKeys,
} from "@shared/checklists/defaults";
import { defaultChecklistsV1 } from "@shared/checklists/defaults-v1";
import { minimumNegativePressurePascals, purgeMinutes } from "@shared/calc/ventilation";

const items = Object.values(defaultChecklists).flatMap((list) => list.items);
const byKey = (key: string) => {
  const item = items.find((candidate) => candidate.key === key);
  if (!item) throw new Error(`No default item ${key}`);
  return item;
};

/**
 * The published sources Lintel's defaults may cite. An item cites one of these, or says "Common
 * practice"; nothing else reaches the phone as a source.
 */
const confirmedSources = [
  "CDC, Sequence for Putting On / How to Safely Remove PPE (CS250672)",
  "CDC, Guideline for Hand Hygiene in Health-Care Settings, MMWR 2002;51(RR-16)",
  "OSHA 29 CFR 1910.134",
  "CDC, Guidelines for Preventing the Transmission of M. tuberculosis in Health-Care Settings, MMWR 2005;54(RR-17)",
  "CDC, Guidelines for Environmental Infection Control in Health-Care Facilities (2003)",
  "NFPA 101 Life Safety Code (2012) 18.3.2.6 / 19.3.2.6",
];

describe("the default checklists, version 2", () => {
  it("when any default item is read, then it cites a confirmed source or says common practice, and belongs to a committee group", () => {
    expect(items.length).toBeGreaterThan(50);
    for (const item of items) {
      const reference = item.reference ?? "";
      const cited =
        reference === commonPractice ||
        reference
          .split("; ")
          .every((part) => confirmedSources.some((source) => part.startsWith(source)));
      expect(cited, `${item.key}: ${reference}`).toBe(true);
      expect(reference, item.key).not.toMatch(/from memory/i);
      expect(categoryOfItem(item.key), item.key).not.toBe("other");
    }
    const keys = items.map((item) => item.key);
    expect(new Set(keys).size).toBe(keys.length);
  });

  it("when an item's citation said more than its source, then version 2 says common practice", () => {
    // The PPE poster gives the order of putting on and removing, not stock levels or where hand
    // rub stands; OSHA 1910.134 (g)(1)(iii) requires the seal check itself, not a displayed guide;
    // no cited source covers monitor alarms, anteroom doors, or an anteroom-to-corridor figure
    // (the CDC gives only the room-to-corridor one).
    for (const key of [
      "don.ppe-stock",
      "doff.hand-rub-reach",
      "don.seal-check-guide",
      "room.monitor-alarm",
      "ante.doors-not-both-open",
      "ante.pressure",
      "ante.hand-rub",
      "don.hand-rub-present",
      "room.airflow",
      "room.door-closed",
      // CDC 2005 TB guidelines on checking direction daily: from memory of the clause, so not cited.
      "room.smoke-test",
      "room.pressure-log",
      // CDC PPE poster on removing the respirator outside the room: from memory, so not cited.
      "doff.respirator-last",
    ])
      expect(byKey(key).reference, key).toBe(commonPractice);
    expect(byKey("ante.room-direction")).toMatchObject({
      severity: "critical",
      reference: commonPractice,
    });
  });

  it("when the pressure items are read, then the room's figure is CDC's 2.5 Pa and the keys that confirm inward air stay", () => {
    // CDC 2005 TB guidelines (document confirmed; clause from memory) and CDC 2003 environmental
    // guideline: at least 0.01 in. w.g. (2.5 Pa) negative to the corridor.
    expect(minimumNegativePressurePascals).toBe(2.5);
    expect(byKey("room.pressure").threshold).toEqual({ op: "<=", value: -2.5 });
    expect(byKey("room.pressure").reference).toMatch(/M\. tuberculosis.*2005/);
    // A smoke test showing air leaving the room is critical (Lintel's own rule).
    expect(byKey("room.smoke-test").severity).toBe("critical");
    const roomKeys = defaultChecklists.isolation_room.items.map((item) => item.key);
    for (const key of [...requiredIsolationRoomKeys, "room.air-changes"])
      expect(roomKeys).toContain(key);
    // Keys stay from version 1: answers and trends follow them.
    const v1Keys = Object.values(defaultChecklistsV1).flatMap((list) =>
      list.items.map((item) => item.key),
    );
    for (const key of v1Keys) expect(items.map((item) => item.key)).toContain(key);
  });

  it("when the hand-rub alcohol is read, then it passes only within 60–95 %", () => {
    // CDC, Guideline for Hand Hygiene 2002 (document confirmed; the 60–95 % sentence from memory);
    // NFPA 101 (2012) 18.3.2.6: solution at most 95 % alcohol (confirmed).
    expect(byKey("don.hand-rub-alcohol")).toMatchObject({
      quantity: "percent",
      threshold: { op: ">=", value: 60 },
    });
    expect(byKey("don.hand-rub-alcohol").reference).toMatch(/MMWR 2002;51\(RR-16\)/);
    expect(byKey("don.hand-rub-alcohol-max")).toMatchObject({
      quantity: "percent",
      threshold: { op: "<=", value: 95 },
    });
    expect(byKey("don.hand-rub-alcohol-max").reference).toMatch(/NFPA 101/);
  });

  it("when the dispenser rules are read, then they carry NFPA 101's figures and spacing is major", () => {
    // NFPA 101 Life Safety Code (2012) 18.3.2.6 / 19.3.2.6.
    expect(byKey("doff.dispenser-spacing")).toMatchObject({ severity: "major" });
    expect(byKey("doff.dispenser-spacing").text).toMatch(/48 in \(1\.22 m\)/);
    for (const key of ["don.dispenser-ignition", "doff.dispenser-ignition"]) {
      expect(byKey(key).text).toMatch(/beside, above or below .* within 1 in \(25 mm\)/);
      expect(byKey(key).reference).toMatch(/NFPA 101/);
    }
    for (const key of ["don.dispenser-volume", "doff.dispenser-volume"]) {
      expect(byKey(key).text).toMatch(/at most 1\.2 L \(0\.32 gal\)/);
      expect(byKey(key).reference).toMatch(/NFPA 101/);
    }
    expect(byKey("don.corridor-width").text).toMatch(/6 ft \(1830 mm\)/);
    expect(byKey("don.corridor-width").reference).toMatch(/NFPA 101/);
  });

  it("when the door items are read, then closed-while-occupied is critical and the self-closer major", () => {
    expect(byKey("room.door-closed")).toMatchObject({ severity: "critical" });
    expect(byKey("room.door-closed").text).toMatch(/closed while the room is occupied/);
    expect(byKey("room.self-closer")).toMatchObject({ severity: "major" });
  });

  it("when the clearance time item is read, then its minutes are CDC Table B.1's at 99.9 %", () => {
    // CDC, Guidelines for Environmental Infection Control (2003), Appendix B, Table B.1 (confirmed):
    // 12 ACH → 35 min and 6 ACH → 69 min to remove 99.9 %.
    const item = byKey("room.clearance-time");
    expect(item.reference).toMatch(/Environmental Infection Control.*Table B\.1/);
    expect(Math.round(purgeMinutes(12, 99.9))).toBe(35);
    expect(Math.round(purgeMinutes(6, 99.9))).toBe(69);
    expect(item.text).toMatch(/35 min at 12 air changes, 69 min at 6/);
  });

  it("when fit-test records and respirator sizes are read, then they cite OSHA 1910.134 (f)(2)", () => {
    // OSHA 29 CFR 1910.134 (f)(2), confirmed: fit test before first use and at least annually.
    expect(byKey("don.fit-test-records").text).toMatch(/12 months/);
    for (const key of ["don.fit-test-records", "don.respirator-sizes", "room.respirators-at-door"])
      expect(byKey(key).reference).toBe("OSHA 29 CFR 1910.134 (f)(2)");
  });

  it("when a practitioner's expected items are looked for, then each is there", () => {
    for (const key of [
      "room.monitor-present",
      "room.pressure-log",
      "room.respirators-at-door",
      "room.hand-rub-entry-exit",
      "room.clearance-time",
      "room.bin-by-exit",
      "doff.eye-protection-container",
      "doff.clean-dirty-line",
      "doff.sink",
      "don.fit-test-records",
    ])
      expect(() => byKey(key), key).not.toThrow();
  });

  it("when the dirty chair is marked not applicable, then a note is needed; other items do not ask", () => {
    expect(notApplicableNeedsNote("doff.dirty-chair")).toBe(true);
    expect(notApplicableNeedsNote("doff.bins-fill")).toBe(false);
  });
});
