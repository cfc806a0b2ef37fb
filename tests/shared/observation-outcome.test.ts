import { describe, expect, it } from "vitest";

import {
  handHygieneCompliance,
  handHygieneMoments,
  observationOutcome,
  type OutcomeRecord,
  type OutcomeStep,
} from "@shared/calc/observation-outcome";

// CDC CS250672 removal example 1: gloves, eye protection, gown, mask or respirator, then hand
// hygiene immediately after all PPE is removed — one hand-hygiene moment, at step 5.
const example1: OutcomeStep[] = [
  { id: "gloves", position: 1, handHygiene: false },
  { id: "eye", position: 2, handHygiene: false },
  { id: "gown", position: 3, handHygiene: false },
  { id: "mask", position: 4, handHygiene: false },
  { id: "hh", position: 5, handHygiene: true },
];

const done = (stepId: string): OutcomeRecord => ({ stepId, done: true, breaches: [] });

describe("the outcome of an observation", () => {
  it("when every step is done with no breach, then it is a clean run with 1 of 1 hand-hygiene moments (CDC CS250672 example 1)", () => {
    const result = observationOutcome(
      example1,
      example1.map((step) => done(step.id)),
    );
    expect(result).toMatchObject({
      outcome: "clean_run",
      breachCount: 0,
      breachedSteps: [],
      handHygiene: { performed: 1, expected: 1 },
    });
    expect(result.steps.every((step) => step.done && !step.breached)).toBe(true);
  });

  it("when the gown touches clean clothing and the hand hygiene at the end is missed, then 2 breaches at steps 3 and 5 and 0 of 1 moments", () => {
    // Worked by hand: step 3 one breach, step 5 one breach → 2; the only moment (step 5) missed.
    const records = example1.map((step) => done(step.id));
    records[2] = {
      stepId: "gown",
      done: true,
      breaches: [{ kind: "touched_face_or_clean_clothing" }],
    };
    records[4] = { stepId: "hh", done: true, breaches: [{ kind: "hand_hygiene_missed" }] };
    const result = observationOutcome(example1, records);
    expect(result.outcome).toBe("breaches_seen");
    expect(result.breachCount).toBe(2);
    expect(result.breachedSteps).toEqual([3, 5]);
    expect(result.handHygiene).toEqual({ performed: 0, expected: 1 });
  });

  it("when one step has two breaches, then both count but the step is listed once", () => {
    const records = example1.map((step) => done(step.id));
    records[0] = {
      stepId: "gloves",
      done: true,
      breaches: [{ kind: "out_of_order" }, { kind: "item_dropped_or_wrong_container" }],
    };
    const result = observationOutcome(example1, records);
    expect(result.breachCount).toBe(2);
    expect(result.breachedSteps).toEqual([1]);
    // A breach at another step leaves the hand-hygiene moment performed.
    expect(result.handHygiene).toEqual({ performed: 1, expected: 1 });
  });

  it("when a hand-hygiene step was not done, then its moment is missed and the skipped step is a breach even with none recorded", () => {
    const records = example1.map((step) => done(step.id));
    records[4] = { stepId: "hh", done: false, breaches: [] };
    const result = observationOutcome(example1, records);
    expect(result.breachCount).toBe(1);
    expect(result.breachedSteps).toEqual([5]);
    expect(result.handHygiene).toEqual({ performed: 0, expected: 1 });
    expect(result.steps[4]).toEqual({ stepId: "hh", position: 5, done: false, breached: true });
  });

  it("when a step was skipped with a step-skipped breach, then it counts once, not twice", () => {
    const records = example1.map((step) => done(step.id));
    records[1] = { stepId: "eye", done: false, breaches: [{ kind: "step_skipped" }] };
    expect(observationOutcome(example1, records).breachCount).toBe(1);
  });
});

describe("hand-hygiene moments (performed ÷ expected, as actions ÷ opportunities in WHO's hand hygiene observation, 2009 — from memory: the handbook confirms only WHO's rub and wash times)", () => {
  // The enhanced removal draft (common practice, from memory): moments at 5 of its 12 steps
  // on gloves and a last one on bare hands — six moments in all.
  const enhanced: OutcomeStep[] = Array.from({ length: 12 }, (_, index) => ({
    id: `s${index + 1}`,
    position: index + 1,
    handHygiene: [2, 4, 6, 8, 10, 12].includes(index + 1),
  }));

  it("when two of six moments are missed (one by breach, one not done), then 4 of 6 performed, compliance 4/6", () => {
    const records = enhanced.map((step) => done(step.id));
    records[3] = { stepId: "s4", done: true, breaches: [{ kind: "hand_hygiene_missed" }] };
    records[9] = { stepId: "s10", done: false, breaches: [{ kind: "step_skipped" }] };
    // A touch at step 6 is a breach, but the hand hygiene there was performed.
    records[5] = {
      stepId: "s6",
      done: true,
      breaches: [{ kind: "touched_face_or_clean_clothing" }],
    };
    const moments = handHygieneMoments(enhanced, records);
    expect(moments).toEqual({ performed: 4, expected: 6 });
    expect(handHygieneCompliance(moments)).toBeCloseTo(4 / 6, 12);
  });

  it("when a sequence expects no moment, then compliance is not a number to report (null), not 0 or 1", () => {
    const steps = example1.filter((step) => !step.handHygiene);
    const moments = handHygieneMoments(
      steps,
      steps.map((step) => done(step.id)),
    );
    expect(moments).toEqual({ performed: 0, expected: 0 });
    expect(handHygieneCompliance(moments)).toBeNull();
  });
});
