import { describe, expect, it } from "vitest";

import {
  formatArea,
  formatScale,
  planAreaSquareMetres,
} from "@/features/floor-plans/lib/measurements";
import { groupSpacesBySuite, spaceTitle } from "@/features/floor-plans/lib/space-groups";
import { parseNumberText } from "@/lib/form-values";

import { buildSpace, suite4 } from "./support/floor-data";

describe("measurements", () => {
  it("when a 4 m by 2.5 m outline is measured, then its area is 10 m², about 107.6 ft²", () => {
    const outline: [number, number][] = [
      [0, 0],
      [160, 0],
      [160, 100],
      [0, 100],
    ];
    const area = planAreaSquareMetres(outline, 0.025);
    expect(area).toBeCloseTo(10, 10);
    expect(formatArea(area ?? 0)).toBe("10.00 m² (107.6 ft²)");
  });

  it("when the floor has no scale, then no area is given", () => {
    expect(planAreaSquareMetres(buildSpace().polygon, null)).toBeNull();
  });

  it("when the scale is shown, then it keeps four significant figures", () => {
    expect(formatScale(0.025)).toBe("0.025 m per plan unit");
    expect(formatScale(0.0123456)).toBe("0.01235 m per plan unit");
  });
});

describe("spaces grouped by suite", () => {
  it("when a suite holds several zone types, then they follow the walk from room to doffing area", () => {
    const doffing = buildSpace({ id: "1", zoneType: "doffing_area", name: "Doffing" });
    const room = buildSpace({ id: "2", zoneType: "isolation_room", name: "Room" });
    const ante = buildSpace({ id: "3", zoneType: "anteroom", name: "Ante" });
    const loose = buildSpace({ id: "4", suiteId: null, name: "Corridor bay" });
    const suite10 = { ...suite4, id: "s10", name: "Suite 10" };
    const suite9 = { ...suite4, id: "s9", name: "Suite 9" };
    const inNine = buildSpace({
      id: "5",
      suiteId: "s9",
      name: "Donning",
      zoneType: "donning_zone",
    });

    const groups = groupSpacesBySuite(
      [doffing, room, loose, ante, inNine],
      [suite10, suite4, suite9],
    );

    expect(groups.map((group) => group.suite?.name ?? null)).toEqual(["Suite 4", "Suite 9", null]);
    expect(groups[0]?.spaces.map((space) => space.name)).toEqual(["Room", "Ante", "Doffing"]);
    expect(groups[2]?.spaces.map((space) => space.name)).toEqual(["Corridor bay"]);
  });

  it("when a space has a number, then its title carries it", () => {
    expect(spaceTitle({ name: "Doffing area", number: "4" })).toBe("Doffing area (No. 4)");
    expect(spaceTitle({ name: "Corridor bay", number: null })).toBe("Corridor bay");
  });
});

describe("numbers typed into forms", () => {
  it.each([
    ["", undefined],
    ["  ", undefined],
    ["50.1234", 50.1234],
    ["50,1234", 50.1234],
    ["-5", -5],
    [".5", 0.5],
  ])("when %j is typed, then it reads as %j", (typed, expected) => {
    expect(parseNumberText(typed)).toBe(expected);
  });

  it.each([["12abc"], ["1.2.3"], ["Infinity"], ["0x10"]])(
    "when %j is typed, then it is not a number",
    (typed) => {
      expect(parseNumberText(typed)).toBeNaN();
    },
  );
});
