import { describe, expect, it } from "vitest";

import { closeDispenserPairs, minimumDispenserSpacingMetres } from "@shared/calc/hand-rub-spacing";
import {
  distanceMetres,
  feetToMetres,
  formatLength,
  inchesToMetres,
  metresToFeet,
  metresToInches,
  pointInPolygon,
  polygonArea,
  polygonCentroid,
  scaleFromReference,
} from "@shared/calc/plan-geometry";

describe("length units", () => {
  // International yard and pound agreement (1959), as used by NIST SP 811: 1 in = 0.0254 m and
  // 1 ft = 0.3048 m exactly.
  it("when converting inches and feet, then the exact definitions hold", () => {
    expect(inchesToMetres(1)).toBe(0.0254);
    expect(feetToMetres(1)).toBe(0.3048);
    expect(metresToInches(0.0254)).toBe(1);
    expect(metresToFeet(3.048)).toBeCloseTo(10, 12);
    expect(inchesToMetres(12)).toBeCloseTo(feetToMetres(1), 15);
  });

  // NFPA 101 (2012) 18.3.2.6 / 19.3.2.6: dispensers at least 48 in apart; 48 in = 1219.2 mm.
  it("when the dispenser spacing is expressed in millimetres, then it is exactly 1219.2 mm", () => {
    expect(minimumDispenserSpacingMetres * 1000).toBeCloseTo(1219.2, 10);
  });

  it("when a length is formatted, then metres and feet-and-inches are both shown", () => {
    expect(formatLength(1)).toBe("1.00 m (3 ft 3.4 in)");
    expect(formatLength(1.2192)).toBe("1.22 m (4 ft 0.0 in)");
    expect(formatLength(0.3048)).toBe("0.30 m (1 ft 0.0 in)");
  });
});

describe("scale and distance on a plan", () => {
  it("when two points 250 units apart are 5 m apart, then a unit is 0.02 m and 150 units are 3 m", () => {
    // 3-4-5 triangle: (100,100) → (250,300) is 150 across and 200 down, 250 units.
    const scale = scaleFromReference({ x: 100, y: 100 }, { x: 250, y: 300 }, 5);
    expect(scale).toBe(0.02);
    expect(distanceMetres({ x: 0, y: 0 }, { x: 90, y: 120 }, scale)).toBeCloseTo(3, 12);
    expect(metresToInches(distanceMetres({ x: 0, y: 0 }, { x: 60.96, y: 0 }, scale))).toBeCloseTo(
      48,
      10,
    );
  });

  it("when the reference points coincide or the distance is not positive, then the scale is refused", () => {
    expect(() => scaleFromReference({ x: 1, y: 1 }, { x: 1, y: 1 }, 2)).toThrow(RangeError);
    expect(() => scaleFromReference({ x: 0, y: 0 }, { x: 1, y: 0 }, 0)).toThrow(RangeError);
  });

  it("when a polygon is a 300 × 200 rectangle, then its area is 60,000 square units (24 m² at 0.02 m)", () => {
    const rect: [number, number][] = [
      [100, 100],
      [400, 100],
      [400, 300],
      [100, 300],
    ];
    expect(polygonArea(rect)).toBe(60_000);
    expect(polygonArea(rect) * 0.02 ** 2).toBeCloseTo(24, 12);
    expect(pointInPolygon({ x: 150, y: 150 }, rect)).toBe(true);
    expect(pointInPolygon({ x: 450, y: 150 }, rect)).toBe(false);
  });

  it("when a polygon is concave, then a point in its notch is outside", () => {
    const l: [number, number][] = [
      [0, 0],
      [200, 0],
      [200, 100],
      [100, 100],
      [100, 200],
      [0, 200],
    ];
    expect(pointInPolygon({ x: 50, y: 150 }, l)).toBe(true);
    expect(pointInPolygon({ x: 150, y: 150 }, l)).toBe(false);
  });
});

describe("hand-rub dispenser spacing (NFPA 101, 2012, 18.3.2.6 / 19.3.2.6: at least 48 in apart)", () => {
  const scale = 0.01; // 1 unit = 1 cm

  it("when two dispensers are 1 m apart, then the pair is flagged with its distance", () => {
    const flags = closeDispenserPairs(
      [
        { id: "a", x: 0, y: 0 },
        { id: "b", x: 100, y: 0 },
      ],
      scale,
    );
    expect(flags).toEqual([{ a: "a", b: "b", distanceMetres: 1 }]);
  });

  it("when they are exactly 48 in (121.92 cm) apart, then nothing is flagged; a hair closer is", () => {
    expect(
      closeDispenserPairs(
        [
          { id: "a", x: 0, y: 0 },
          { id: "b", x: 121.92, y: 0 },
        ],
        scale,
      ),
    ).toEqual([]);
    expect(
      closeDispenserPairs(
        [
          { id: "a", x: 0, y: 0 },
          { id: "b", x: 121.9, y: 0 },
        ],
        scale,
      ),
    ).toHaveLength(1);
  });

  it("when three dispensers stand in a row 1 m apart, then only the two neighbouring pairs are flagged", () => {
    const flags = closeDispenserPairs(
      [
        { id: "a", x: 0, y: 0 },
        { id: "b", x: 100, y: 0 },
        { id: "c", x: 200, y: 0 },
      ],
      scale,
    );
    expect(flags.map((flag) => `${flag.a}-${flag.b}`)).toEqual(["a-b", "b-c"]);
  });

  it("when the floor has no scale, then nothing can be checked", () => {
    expect(
      closeDispenserPairs(
        [
          { id: "a", x: 0, y: 0 },
          { id: "b", x: 1, y: 0 },
        ],
        null,
      ),
    ).toEqual([]);
  });
});

describe("where a finding's pin goes", () => {
  it("when the space is a rectangle, then the pin is at its centre", () => {
    expect(
      polygonCentroid([
        [100, 50],
        [400, 50],
        [400, 250],
        [100, 250],
      ]),
    ).toEqual({ x: 250, y: 150 });
  });

  it("when the space is an L shape, then the pin is the area centroid, not the mean of the corners", () => {
    // Two rectangles: 0–20 × 0–10 (area 200, centre 10,5) and 0–10 × 10–30 (area 200, centre 5,20):
    // centroid = area-weighted mean of the parts = (7.5, 12.5), exactly.
    const l: [number, number][] = [
      [0, 0],
      [20, 0],
      [20, 10],
      [10, 10],
      [10, 30],
      [0, 30],
    ];
    const centre = polygonCentroid(l);
    expect(centre.x).toBeCloseTo(7.5, 12);
    expect(centre.y).toBeCloseTo(12.5, 12);
  });

  it("when the corners are listed the other way round or the polygon is flat, then it still gives a point inside the corners", () => {
    expect(
      polygonCentroid([
        [0, 0],
        [0, 10],
        [10, 10],
        [10, 0],
      ]),
    ).toEqual({ x: 5, y: 5 });
    expect(
      polygonCentroid([
        [0, 0],
        [10, 0],
      ]),
    ).toEqual({ x: 5, y: 0 });
    expect(() => polygonCentroid([])).toThrow(RangeError);
  });
});
