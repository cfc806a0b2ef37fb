import { describe, expect, it } from "vitest";

import {
  formatPlanPoint,
  latLngToPlan,
  planBounds,
  planToLatLng,
  pointsToPolygon,
  polygonToLatLngs,
  tidyPlanPoint,
} from "@/features/floor-plans/lib/plan-coordinates";

describe("plan coordinates on the map", () => {
  it("when a plan point goes to the map, then y down becomes latitude down and x becomes longitude", () => {
    expect(planToLatLng({ x: 120, y: 340 })).toEqual([-340, 120]);
    expect(planToLatLng({ x: 0, y: 0 })).toEqual([0, 0]);
  });

  it("when a map position comes back, then it is the plan point it came from", () => {
    expect(latLngToPlan({ lat: -340, lng: 120 })).toEqual({ x: 120, y: 340 });
    for (const point of [
      { x: 0, y: 0 },
      { x: 1199.5, y: 799.25 },
      { x: -12, y: 40 },
    ]) {
      const [lat, lng] = planToLatLng(point);
      expect(latLngToPlan({ lat, lng })).toEqual(point);
    }
  });

  it("when the plan's top-left corner is converted, then no negative zero appears", () => {
    const [lat] = planToLatLng({ x: 5, y: 0 });
    expect(Object.is(lat, -0)).toBe(false);
    expect(Object.is(latLngToPlan({ lat: 0, lng: 0 }).y, -0)).toBe(false);
  });

  it("when bounds are made for a plan, then they run from its bottom-left to its top-right", () => {
    expect(planBounds({ width: 1200, height: 800 })).toEqual([
      [-800, 0],
      [0, 1200],
    ]);
  });

  it("when a space's outline is drawn, then every corner is converted in order", () => {
    expect(
      polygonToLatLngs([
        [10, 20],
        [30, 20],
        [30, 50],
      ]),
    ).toEqual([
      [-20, 10],
      [-20, 30],
      [-50, 30],
    ]);
    expect(
      pointsToPolygon([
        { x: 10, y: 20 },
        { x: 30, y: 20 },
      ]),
    ).toEqual([
      [10, 20],
      [30, 20],
    ]);
  });

  it("when a tap lands between plan units, then it is kept to whole units and shown the same way", () => {
    expect(tidyPlanPoint({ x: 120.4, y: 339.6 })).toEqual({ x: 120, y: 340 });
    expect(tidyPlanPoint({ x: -0.2, y: 0.1 })).toEqual({ x: 0, y: 0 });
    expect(formatPlanPoint({ x: 120.4, y: 339.6 })).toBe("x 120, y 340");
  });
});
