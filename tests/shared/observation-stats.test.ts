import { describe, expect, it } from "vitest";

import {
  monthsOf,
  networkTally,
  observationFigures,
  peopleAtLeast,
  type SiteObservationTally,
  type StepTally,
} from "@shared/calc/observation-stats";

const round4 = (value: number) => Math.round(value * 10_000) / 10_000;
const rounded = (interval: { lower: number; upper: number } | null) =>
  interval ? [round4(interval.lower), round4(interval.upper)] : null;

const step = (overrides: Partial<StepTally> & Pick<StepTally, "stepKey">): StepTally => ({
  sequenceKey: "standard-removal-1",
  sequenceTitle: "Removal, example 1",
  stepText: `Step ${overrides.stepKey}`,
  position: 1,
  observations: 60,
  breached: 0,
  staffCodes: 12,
  withoutCode: 0,
  ...overrides,
});

const tally = (overrides: Partial<SiteObservationTally> = {}): SiteObservationTally => ({
  observations: 263,
  staffCodes: 40,
  withoutCode: 0,
  steps: [],
  handHygiene: {
    observations: 148,
    allMoments: 15,
    performed: 1100,
    expected: 1184,
    staffCodes: 30,
    withoutCode: 0,
  },
  perMonth: [],
  afterCoaching: { staffCodes: 29, clean: 1 },
  ...overrides,
});

const months = ["2026-01", "2026-02", "2026-03"];

describe("observation figures for the committee", () => {
  it("when a step was breached in 81 of 263 observations, then its rate and 95% interval are the Wilson score interval of 81/263", () => {
    const figures = observationFigures(
      tally({ steps: [step({ stepKey: "gloves", observations: 263, breached: 81 })] }),
      months,
    );
    const [gloves] = figures.steps;
    expect(gloves!.suppressed).toBe(false);
    expect(gloves!.breached.n).toBe(263);
    expect(gloves!.breached.successes).toBe(81);
    expect(gloves!.breached.rate).toBeCloseTo(81 / 263, 12);
    // Newcombe 1998, Table I, method 3 (Wilson 1927 score interval), confirmed: 0.2553–0.3662.
    expect(rounded(gloves!.breached.interval)).toEqual([0.2553, 0.3662]);
    expect(gloves!.breached.smallSample).toBe(false);
  });

  it("when every moment was performed in 15 of 148 observations, then the share carries the Wilson interval and the moment rate stands beside it without one", () => {
    const figures = observationFigures(tally(), months);
    expect(figures.handHygieneAllMoments.successes).toBe(15);
    expect(figures.handHygieneAllMoments.n).toBe(148);
    // Newcombe 1998, Table I, method 3, confirmed: 15/148 → 0.0624–0.1605.
    expect(rounded(figures.handHygieneAllMoments.interval)).toEqual([0.0624, 0.1605]);
    expect(figures.handHygieneAllMoments.suppressed).toBe(false);
    // 1100 performed of 1184 expected moments: 0.92905…, a plain ratio (moments are not independent).
    expect(figures.handHygieneMomentRate).toBeCloseTo(0.929054, 6);
  });

  it("when 29 coached staff codes were observed again and 1 was clean, then the share is 1/29 with its Wilson interval and a small-sample flag", () => {
    const figures = observationFigures(tally(), months);
    expect(figures.cleanAfterCoaching.n).toBe(29);
    expect(figures.cleanAfterCoaching.successes).toBe(1);
    // Computed from Newcombe's formula (references §7): 1/29 → 0.0061–0.1718.
    expect(rounded(figures.cleanAfterCoaching.interval)).toEqual([0.0061, 0.1718]);
    // Fewer than 30: flagged, as readiness is (Lintel's rule).
    expect(figures.cleanAfterCoaching.smallSample).toBe(true);
  });

  it("when a site's observations describe only 4 staff codes, then every figure is withheld but the count and the months stay", () => {
    const figures = observationFigures(
      tally({
        observations: 20,
        staffCodes: 4,
        steps: [step({ stepKey: "gloves", observations: 20, breached: 9, staffCodes: 4 })],
        perMonth: [{ month: "2026-02", observations: 20 }],
      }),
      months,
    );
    expect(figures.suppressed).toBe(true);
    expect(figures.observations).toBe(20);
    expect(figures.steps).toEqual([]);
    expect(figures.mostErrorProne).toEqual([]);
    expect(figures.handHygieneAllMoments).toMatchObject({ suppressed: true, n: 0, rate: null });
    expect(figures.handHygieneMomentRate).toBeNull();
    expect(figures.cleanAfterCoaching).toMatchObject({ suppressed: true, n: 0, rate: null });
    expect(figures.perMonth).toEqual([
      { month: "2026-01", observations: 0 },
      { month: "2026-02", observations: 20 },
      { month: "2026-03", observations: 0 },
    ]);
    // Five codes is enough (Lintel's rule: fewer than 5 is withheld).
    expect(observationFigures(tally({ observations: 20, staffCodes: 5 }), months).suppressed).toBe(
      false,
    );
  });

  it("when observations lost their staff codes after retention, then they count in the rates but stand for one person at most", () => {
    expect(peopleAtLeast({ staffCodes: 4, withoutCode: 50 })).toBe(4);
    expect(peopleAtLeast({ staffCodes: 0, withoutCode: 50 })).toBe(1);
    expect(peopleAtLeast({ staffCodes: 0, withoutCode: 0 })).toBe(0);
    const old = observationFigures(
      tally({ observations: 50, staffCodes: 0, withoutCode: 50 }),
      months,
    );
    expect(old.suppressed).toBe(true);
    const mixed = observationFigures(
      tally({
        observations: 70,
        staffCodes: 6,
        withoutCode: 50,
        steps: [
          step({ stepKey: "gown", observations: 70, breached: 7, staffCodes: 6, withoutCode: 50 }),
        ],
      }),
      months,
    );
    expect(mixed.suppressed).toBe(false);
    expect(mixed.steps[0]!.breached.n).toBe(70);
    expect(mixed.steps[0]!.breached.successes).toBe(7);
  });

  it("when one step or the coached group describes fewer than 5 staff codes inside a site that has enough, then only that figure is withheld", () => {
    const figures = observationFigures(
      tally({
        steps: [
          step({ stepKey: "gloves", observations: 60, breached: 30, staffCodes: 12 }),
          step({
            sequenceKey: "enhanced-removal",
            stepKey: "apron",
            observations: 40,
            breached: 35,
            staffCodes: 3,
          }),
        ],
        afterCoaching: { staffCodes: 4, clean: 4 },
      }),
      months,
    );
    expect(figures.suppressed).toBe(false);
    const apron = figures.steps.find((row) => row.stepKey === "apron")!;
    expect(apron.suppressed).toBe(true);
    expect(apron.breached).toMatchObject({ n: 0, successes: 0, rate: null, interval: null });
    // The withheld step is never ranked, though its rate would have been the highest.
    expect(figures.mostErrorProne.map((row) => row.stepKey)).toEqual(["gloves"]);
    expect(figures.cleanAfterCoaching).toMatchObject({ suppressed: true, n: 0, rate: null });
    // Nobody coached and seen again: nothing to withhold, nothing to show.
    const none = observationFigures(tally({ afterCoaching: { staffCodes: 0, clean: 0 } }), months);
    expect(none.cleanAfterCoaching).toMatchObject({ suppressed: false, n: 0, rate: null });
  });

  it("when steps are ranked, then only steps with 30 or more observations and a breach count, five at most, highest rate first and ties to the surer figure", () => {
    const steps = [
      step({ stepKey: "a", position: 1, observations: 29, breached: 28 }), // too few to rank
      step({ stepKey: "b", position: 2, observations: 30, breached: 15 }), // 0.5
      step({ stepKey: "c", position: 3, observations: 60, breached: 30 }), // 0.5, narrower interval
      step({ stepKey: "d", position: 4, observations: 100, breached: 40 }), // 0.4
      step({ stepKey: "e", position: 5, observations: 100, breached: 10 }), // 0.1
      step({ stepKey: "f", position: 6, observations: 100, breached: 20 }), // 0.2
      step({ stepKey: "g", position: 7, observations: 100, breached: 5 }), // 0.05: sixth
      step({ stepKey: "h", position: 8, observations: 100, breached: 0 }), // never breached
    ];
    const figures = observationFigures(tally({ steps }), months);
    expect(figures.steps.map((row) => row.stepKey)).toEqual([
      "a",
      "b",
      "c",
      "d",
      "e",
      "f",
      "g",
      "h",
    ]);
    expect(figures.steps[0]!.breached.smallSample).toBe(true);
    expect(figures.mostErrorProne.map((row) => row.stepKey)).toEqual(["c", "b", "d", "f", "e"]);
  });

  it("when two sites of 3 staff codes each are added up, then each site is withheld and the network of 6 codes is not", () => {
    const site = (breached: number) =>
      tally({
        observations: 40,
        staffCodes: 3,
        steps: [step({ stepKey: "gloves", observations: 40, breached, staffCodes: 3 })],
        handHygiene: {
          observations: 40,
          allMoments: 30,
          performed: 90,
          expected: 100,
          staffCodes: 3,
          withoutCode: 0,
        },
        perMonth: [
          { month: "2026-01", observations: 10 },
          { month: "2026-03", observations: 30 },
        ],
        afterCoaching: { staffCodes: 3, clean: 2 },
      });
    const [first, second] = [site(10), site(30)];
    expect(observationFigures(first, months).suppressed).toBe(true);
    const network = observationFigures(networkTally([first, second]), months);
    expect(network.suppressed).toBe(false);
    expect(network.observations).toBe(80);
    expect(network.steps).toHaveLength(1);
    expect(network.steps[0]!.breached).toMatchObject({ n: 80, successes: 40, rate: 0.5 });
    expect(network.handHygieneAllMoments).toMatchObject({ n: 80, successes: 60, rate: 0.75 });
    expect(network.handHygieneMomentRate).toBeCloseTo(180 / 200, 12);
    expect(network.cleanAfterCoaching).toMatchObject({ n: 6, successes: 4, suppressed: false });
    expect(network.perMonth).toEqual([
      { month: "2026-01", observations: 20 },
      { month: "2026-02", observations: 0 },
      { month: "2026-03", observations: 60 },
    ]);
  });

  it("when a period crosses the new year, then every month is listed in order", () => {
    expect(monthsOf("2025-11", "2026-02")).toEqual(["2025-11", "2025-12", "2026-01", "2026-02"]);
    expect(monthsOf("2026-03", "2026-03")).toEqual(["2026-03"]);
  });
});
