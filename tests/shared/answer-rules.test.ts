import { describe, expect, it } from "vitest";

import {
  AnswerRefusal,
  decideAnswer,
  fromSi,
  meetsPressureThreshold,
  outcomeOfEntry,
  type RuledItem,
  toSi,
  unitsForQuantity,
} from "@shared/calc/answer-rules";
import { minimumNegativePressurePascals } from "@shared/calc/ventilation";

// CDC 2005 TB guidelines, MMWR 54(RR-17): at least 0.01 in. w.c. (water gauge) = 2.5 Pa negative
// to the corridor (document confirmed; clause from memory). Stated in both units.
const cdc = { op: "<=" as const, value: -minimumNegativePressurePascals };
const pressureItem: RuledItem = { response: "reading", quantity: "pressure", threshold: cdc };
const airChanges: RuledItem = { response: "reading", quantity: "air_changes", threshold: null };

describe("meetsPressureThreshold: met at the figure the source states, in the unit entered", () => {
  it("when −0.010 in. w.c. is entered (the CDC figure), then it passes though it is 2.49 Pa", () => {
    expect(toSi(-0.01, "inH2O")).toBeGreaterThan(-2.5);
    expect(meetsPressureThreshold(-0.01, "inH2O", cdc)).toBe(true);
    expect(meetsPressureThreshold(-0.0099, "inH2O", cdc)).toBe(false);
  });

  it("when −2.5 Pa is entered (the CDC figure), then it passes; −2.4 Pa fails", () => {
    expect(meetsPressureThreshold(-2.5, "Pa", cdc)).toBe(true);
    expect(meetsPressureThreshold(-2.4, "Pa", cdc)).toBe(false);
    expect(meetsPressureThreshold(-12, "Pa", cdc)).toBe(true);
  });

  it("when a figure is reached through float arithmetic, then the tiny tolerance lets it pass (Lintel's own rule)", () => {
    // 0.1 × 0.1 is 0.010000000000000002 in binary floating point.
    expect(meetsPressureThreshold(-(0.1 * 0.1), "inH2O", cdc)).toBe(true);
    // (1 − 0.9) × 25 is 2.4999999999999996: a hair short of 2.5 by float noise alone.
    expect(-(1 - 0.9) * 25).toBeGreaterThan(-2.5);
    expect(meetsPressureThreshold(-(1 - 0.9) * 25, "Pa", cdc)).toBe(true);
    // The tolerance is relative and tiny: a thousandth of a pascal short still fails.
    expect(meetsPressureThreshold(-2.499, "Pa", cdc)).toBe(false);
  });

  it("when the room is positive or the value is not a number, then it does not meet a negative threshold", () => {
    expect(meetsPressureThreshold(3, "Pa", cdc)).toBe(false);
    expect(meetsPressureThreshold(0.01, "inH2O", cdc)).toBe(false);
    expect(meetsPressureThreshold(Number.NaN, "Pa", cdc)).toBe(false);
  });

  it("when a threshold is not the CDC figure, then it is converted to the unit entered (Lintel's own rule)", () => {
    const five = { op: "<=" as const, value: -5 };
    expect(meetsPressureThreshold(-0.0201, "inH2O", five)).toBe(true);
    expect(meetsPressureThreshold(-0.02, "inH2O", five)).toBe(false);
  });
});

describe("conversions at the exact CDC figure (NIST SP 811 conventional inch of water, from memory)", () => {
  it("when 0.01 in. w.c. is converted, then it is 2.4908891 Pa; 2.5 Pa is 0.010037 in. w.c.", () => {
    expect(toSi(-0.01, "inH2O")).toBeCloseTo(-2.4908891, 7);
    expect(fromSi(-2.5, "inH2O")).toBeCloseTo(-0.010037, 6);
    expect(fromSi(toSi(-0.01, "inH2O"), "inH2O")).toBeCloseTo(-0.01, 15);
  });

  it("when 100 cfm is converted, then it is 169.901 m³/h (1 cfm = 4.7194744×10⁻⁴ m³/s)", () => {
    expect(toSi(100, "cfm")).toBeCloseTo(100 * 4.7194744e-4 * 3600, 4);
    expect(fromSi(toSi(318, "cfm"), "cfm")).toBeCloseTo(318, 9);
  });
});

describe("decideAnswer: the answer rules the phone and the server share", () => {
  it("when a pressure is entered in inches of water, then the entry, its unit and its Pa value are kept", () => {
    expect(
      decideAnswer(pressureItem, { outcome: "pass", value: -0.01, unit: "inH2O" }, null),
    ).toMatchObject({ outcome: "pass", enteredValue: -0.01, unit: "inH2O" });
    const decided = decideAnswer(pressureItem, { outcome: "pass", value: -2.4, unit: "Pa" }, null);
    expect(decided).toMatchObject({ outcome: "fail", value: -2.4, enteredValue: -2.4, unit: "Pa" });
  });

  it("when the auditor claims pass but the reading misses the threshold, then the reading decides", () => {
    expect(
      decideAnswer(pressureItem, { outcome: "pass", value: 3, unit: "Pa" }, null).outcome,
    ).toBe("fail");
  });

  it("when a reading is implausible, in the wrong unit or missing, then the rule refuses naming the field (Lintel's own rule)", () => {
    const refusal = (entry: Parameters<typeof decideAnswer>[1]) => {
      try {
        decideAnswer(pressureItem, entry, null);
      } catch (error) {
        return error instanceof AnswerRefusal ? error.field : "other";
      }
      return null;
    };
    expect(refusal({ outcome: "pass", value: -101, unit: "Pa" })).toBe("value");
    expect(refusal({ outcome: "pass", value: -0.5, unit: "inH2O" })).toBe("value");
    expect(refusal({ outcome: "pass", value: -3, unit: "cfm" })).toBe("unit");
    expect(refusal({ outcome: "pass", value: null })).toBe("value");
    expect(refusal({ outcome: "pass", value: Number.NaN, unit: "Pa" })).toBe("value");
    expect(refusal({ outcome: "not_applicable", value: -900, unit: "Pa" })).toBeNull();
  });

  // CDC 2005 TB guidelines / VA design guide quoting CDC 1994 (confirmed): ≥ 12 ACH for new or
  // renovated rooms, ≥ 6 for existing ones.
  it("when air changes have no threshold of their own, then the room's class minimum decides", () => {
    const entry = { outcome: "pass" as const, value: 11.9, unit: "ach" as const };
    expect(decideAnswer(airChanges, entry, { minimumAirChanges: 12 }).outcome).toBe("fail");
    expect(decideAnswer(airChanges, entry, { minimumAirChanges: 6 }).outcome).toBe("pass");
    expect(
      decideAnswer(airChanges, { ...entry, value: 12 }, { minimumAirChanges: 12 }).outcome,
    ).toBe("pass");
  });

  it("when the phone judges an entry, then it agrees with what the server decides", () => {
    for (const [value, unit] of [
      [-0.01, "inH2O"],
      [-0.0099, "inH2O"],
      [-2.5, "Pa"],
      [-2.4, "Pa"],
      [4, "Pa"],
    ] as const) {
      const entry = { outcome: "pass" as const, value, unit };
      expect(outcomeOfEntry(pressureItem, entry, null)).toBe(
        decideAnswer(pressureItem, entry, null).outcome,
      );
    }
  });

  it("when units are listed, then the stored SI unit comes first", () => {
    expect(unitsForQuantity.pressure[0]).toBe("Pa");
    expect(unitsForQuantity.airflow[0]).toBe("m3/h");
  });
});
