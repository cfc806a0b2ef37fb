import { describe, expect, it } from "vitest";

import {
  checkHandRubSpacing,
  flaggedStationIds,
  spacingPairMessage,
} from "@/features/floor-plans/lib/spacing-check";

import { buildFixture } from "./support/floor-data";

const first = buildFixture({ id: "a1", x: 1000, y: 300 });
const metresPerUnit = 0.025;

describe("hand-rub spacing check", () => {
  it("when two stations are 1 m apart, then the pair is flagged with the distance in metres and feet and the rule", () => {
    const second = buildFixture({ id: "a2", x: 1000, y: 340 });

    const check = checkHandRubSpacing([first, second], metresPerUnit);

    expect(check.kind).toBe("checked");
    if (check.kind !== "checked") return;
    expect(check.pairs).toHaveLength(1);
    expect(check.pairs[0]?.a.id).toBe("a1");
    expect(check.pairs[0]?.b.id).toBe("a2");
    expect(check.pairs[0]?.message).toBe(
      "Hand-rub stations 1.00 m (3 ft 3.4 in) apart — at least 48 in (1.22 m) is required (NFPA 101, 2012, 18.3.2.6 / 19.3.2.6).",
    );
    expect(check.message).toBe("One pair of hand-rub stations is too close together.");
    expect([...flaggedStationIds(check)].sort()).toEqual(["a1", "a2"]);
  });

  it("when stations are exactly 48 in apart, then they are not flagged", () => {
    // 1.2192 m at 0.025 m a unit is 48.768 units.
    const second = buildFixture({ id: "a2", x: 1000, y: 300 + 48.768 });

    const check = checkHandRubSpacing([first, second], metresPerUnit);

    expect(check.kind === "checked" && check.pairs).toEqual([]);
    expect(check.message).toBe(
      "All 2 hand-rub stations on this floor are at least 48 in (1.22 m) apart.",
    );
  });

  it("when other fixtures stand close to a station, then only hand-rub stations are compared", () => {
    const chair = buildFixture({ id: "c1", kind: "dirty_chair", x: 1000, y: 310 });
    const bin = buildFixture({ id: "b1", kind: "hands_free_bin", x: 1002, y: 302 });

    const check = checkHandRubSpacing([first, chair, bin], metresPerUnit);

    expect(check.kind === "checked" && check.pairs).toEqual([]);
    expect(check.message).toBe(
      "One hand-rub station is placed on this floor, so there is no spacing to check.",
    );
  });

  it("when three stations stand in a row, then each close pair is listed", () => {
    const second = buildFixture({ id: "a2", x: 1000, y: 330 });
    const third = buildFixture({ id: "a3", x: 1000, y: 360 });

    const check = checkHandRubSpacing([first, second, third], metresPerUnit);

    expect(
      check.kind === "checked" && check.pairs.map((pair) => `${pair.a.id}-${pair.b.id}`),
    ).toEqual(["a1-a2", "a2-a3"]);
    expect(check.message).toBe("2 pairs of hand-rub stations are too close together.");
  });

  it("when the floor has no scale, then nothing is flagged and the panel says the scale is needed", () => {
    const second = buildFixture({ id: "a2", x: 1000, y: 301 });

    const check = checkHandRubSpacing([first, second], null);

    expect(check.kind).toBe("no-scale");
    expect(check.message).toBe(
      "Spacing between hand-rub stations cannot be checked until the scale of this floor is set.",
    );
    expect(flaggedStationIds(check).size).toBe(0);
  });

  it("when no station is placed, then the panel says so", () => {
    expect(checkHandRubSpacing([], metresPerUnit).message).toBe(
      "No hand-rub stations are placed on this floor yet.",
    );
  });

  it("when a distance rounds up to a whole foot, then the feet carry over", () => {
    expect(spacingPairMessage(0.3047)).toContain("0.30 m (1 ft 0.0 in) apart");
  });

  it("when the floor's scale is zero, negative or not a number, then spacing is not checked and the page asks for the scale", () => {
    const second = buildFixture({ id: "a2", x: 1000, y: 301 });
    for (const bad of [0, -0.025, Number.NaN, Number.POSITIVE_INFINITY]) {
      const check = checkHandRubSpacing([first, second], bad);
      expect(check.kind).toBe("no-scale");
      expect(check.message).toBe(
        "Spacing between hand-rub stations cannot be checked until the scale of this floor is set.",
      );
    }
  });
});
