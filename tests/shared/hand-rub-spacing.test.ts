import { describe, expect, it } from "vitest";

import {
  closeDispenserPairs,
  isUsableScale,
  minimumDispenserSpacingMetres,
} from "@shared/calc/hand-rub-spacing";
import { inchesToMetres, scaleFromReference } from "@shared/calc/plan-geometry";

// NFPA 101 Life Safety Code (2012), 18.3.2.6 (new) and 19.3.2.6 (existing): alcohol-based hand-rub
// dispensers at least 48 in apart horizontally; 48 in = 1219.2 mm exactly.
const unitsPerMetreScales = [1, 0.1, 37.5, 123.456, 3, 7, 1000 / 3];

/** Two dispensers `inches` apart on a plan drawn at `unitsPerMetre`, placed as a person would. */
function pairAt(inches: number, unitsPerMetre: number, direction: "across" | "diagonal") {
  const metresPerUnit = 1 / unitsPerMetre;
  const units = inchesToMetres(inches) * unitsPerMetre;
  const origin = { id: "first", x: 103.7, y: 41.3 };
  const other =
    direction === "across"
      ? { id: "second", x: origin.x + units, y: origin.y }
      : { id: "second", x: origin.x + units * 0.6, y: origin.y + units * 0.8 };
  return { dispensers: [origin, other], metresPerUnit };
}

describe("hand-rub dispenser spacing (NFPA 101, 2012, 18.3.2.6 / 19.3.2.6)", () => {
  it.each(unitsPerMetreScales)(
    "when two dispensers are exactly 48 in apart at %s plan units per metre, then NFPA 101 spacing is met and they are not flagged",
    (unitsPerMetre) => {
      for (const direction of ["across", "diagonal"] as const) {
        const { dispensers, metresPerUnit } = pairAt(48, unitsPerMetre, direction);
        expect(closeDispenserPairs(dispensers, metresPerUnit)).toEqual([]);
      }
    },
  );

  it("when the scale is set from a reference and dispensers are then placed 48 in apart, then NFPA 101 spacing is met at every scale", () => {
    for (const unitsPerMetre of unitsPerMetreScales) {
      // The administrator sets the scale from a 5 m wall, as the floor tools do.
      const scale = scaleFromReference({ x: 0, y: 0 }, { x: 5 * unitsPerMetre, y: 0 }, 5);
      const units = minimumDispenserSpacingMetres / scale;
      const dispensers = [
        { id: "a", x: 10, y: 10 },
        { id: "b", x: 10 + units * 0.6, y: 10 + units * 0.8 },
      ];
      expect(closeDispenserPairs(dispensers, scale)).toEqual([]);
    }
  });

  it.each(unitsPerMetreScales)(
    "when two dispensers are just under 48 in apart (47.99 in) at %s plan units per metre, then the pair is flagged under NFPA 101",
    (unitsPerMetre) => {
      const { dispensers, metresPerUnit } = pairAt(47.99, unitsPerMetre, "diagonal");
      const flags = closeDispenserPairs(dispensers, metresPerUnit);
      expect(flags).toHaveLength(1);
      expect(flags[0]).toMatchObject({ a: "first", b: "second" });
      expect(flags[0]!.distanceMetres).toBeCloseTo(inchesToMetres(47.99), 9);
    },
  );

  it("when the floor has no scale, then nothing is flagged; when the scale is zero, negative or not a number, then it is refused", () => {
    const { dispensers } = pairAt(10, 1, "across");
    expect(closeDispenserPairs(dispensers, null)).toEqual([]);
    for (const bad of [0, -0.02, Number.NaN, Number.POSITIVE_INFINITY]) {
      expect(isUsableScale(bad)).toBe(false);
      expect(() => closeDispenserPairs(dispensers, bad)).toThrow(RangeError);
    }
    expect(isUsableScale(0.02)).toBe(true);
  });

  it("when the reference points are a hair apart or the distance vanishes, then no scale of infinity or zero comes out", () => {
    expect(() => scaleFromReference({ x: 0, y: 0 }, { x: 5e-324, y: 0 }, 5)).toThrow(RangeError);
    expect(() => scaleFromReference({ x: 0, y: 0 }, { x: 2_000_000, y: 0 }, 5e-324)).toThrow(
      RangeError,
    );
  });
});
