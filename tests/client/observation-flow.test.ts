import { describe, expect, it } from "vitest";

import {
  type ObservationDraft,
  type ObservationEvent,
  newObservationDraft,
  observationBody,
  observationReducer,
  outcomeOnPhone,
  sequenceKindsFor,
  setupProblem,
} from "@/features/walkthroughs/lib/observation-flow";

import { doffingAreaSpaceId, removalSequence } from "./support/observation-data";

const at = (minute: number) => new Date(Date.UTC(2026, 2, 2, 9, minute));

function run(events: ObservationEvent[], from?: ObservationDraft): ObservationDraft {
  return events.reduce(
    observationReducer,
    from ??
      newObservationDraft({
        observationId: "4e000000-0000-4000-8000-000000000001",
        spaceId: doffingAreaSpaceId,
        spaceName: "Doffing area 1",
        zoneType: "doffing_area",
      }),
  );
}

const ready: ObservationEvent[] = [
  { type: "choose-sequence", sequence: removalSequence() },
  { type: "set-person", staffCode: " rn-204 ", staffRole: "nurse" },
  { type: "begin", now: at(0) },
  { type: "precheck", key: "waste_not_overfull", ok: true },
  { type: "precheck", key: "hand_rub_within_reach", ok: false },
  { type: "precheck", key: "sides_marked", ok: true },
  { type: "precheck-done" },
];

describe("the observation's step flow on the phone", () => {
  it("when the zone is a donning zone, a doffing area or an anteroom, then only the fitting kinds of sequence are offered", () => {
    expect(sequenceKindsFor("donning_zone")).toEqual(["putting_on"]);
    expect(sequenceKindsFor("doffing_area")).toEqual(["removal"]);
    expect(sequenceKindsFor("anteroom")).toEqual(["putting_on", "removal"]);
  });

  it("when the staff code looks like a name or the role is missing, then the observation does not begin and says why", () => {
    const named = run([
      { type: "choose-sequence", sequence: removalSequence() },
      { type: "set-person", staffCode: "Jane Smith", staffRole: "nurse" },
      { type: "begin", now: at(0) },
    ]);
    expect(named.phase).toBe("setup");
    expect(setupProblem(named)).toMatch(/staff code.*not a name/);

    const noRole = run([
      { type: "choose-sequence", sequence: removalSequence() },
      { type: "set-person", staffCode: "RN-204", staffRole: null },
      { type: "begin", now: at(0) },
    ]);
    expect(noRole.phase).toBe("setup");
    expect(setupProblem(noRole)).toBe("Choose the role of the person observed.");
  });

  it("when the area check is not answered in full, then the steps do not start", () => {
    const partial = run(ready.slice(0, 5).concat({ type: "precheck-done" }));
    expect(partial.phase).toBe("precheck");
    const checked = run(ready);
    expect(checked.phase).toBe("steps");
    expect(checked.stepIndex).toBe(0);
    expect(checked.staffCode).toBe("RN-204");
  });

  it("when each step is marked done or with a breach, then the flow moves on one step at a time and ends at coaching", () => {
    const draft = run([
      ...ready,
      { type: "step-done" },
      { type: "open-breach" },
      {
        type: "record-breach",
        breach: {
          kind: "touched_face_or_clean_clothing",
          cause: "technique",
          // A space problem left over from a changed mind is dropped when the cause is technique.
          spaceProblem: "bin_full",
          note: "  touched the chin  ",
        },
      },
      { type: "step-done" },
      { type: "step-done" },
    ]);
    expect(draft.phase).toBe("steps");
    expect(draft.stepIndex).toBe(4);
    expect(draft.steps[1]).toEqual({
      stepId: removalSequence().steps[1]!.id,
      done: true,
      breaches: [
        {
          kind: "touched_face_or_clean_clothing",
          cause: "technique",
          spaceProblem: null,
          note: "touched the chin",
        },
      ],
    });
    const last = run([{ type: "step-done" }], draft);
    expect(last.phase).toBe("coaching");
  });

  it("when a step is recorded as skipped, then it counts as not done", () => {
    const draft = run([
      ...ready,
      { type: "open-breach" },
      {
        type: "record-breach",
        breach: { kind: "step_skipped", cause: "space", spaceProblem: "bin_full", note: null },
      },
    ]);
    expect(draft.steps[0]).toMatchObject({ done: false });
    expect(draft.steps[0]!.breaches[0]).toMatchObject({ cause: "space", spaceProblem: "bin_full" });
  });

  it("when the observer goes back a step and records it again, then the later record replaces the earlier one", () => {
    const draft = run([
      ...ready,
      { type: "step-done" },
      { type: "back" },
      { type: "open-breach" },
      {
        type: "record-breach",
        breach: { kind: "out_of_order", cause: "technique", spaceProblem: null, note: null },
      },
    ]);
    expect(draft.stepIndex).toBe(1);
    expect(draft.steps[0]!.breaches).toHaveLength(1);
    expect(draft.steps.filter((record) => record !== null)).toHaveLength(1);
  });

  it("when the observation is finished, then the body holds every step, the area check and the coaching, and the outcome is decided by Lintel's rule", () => {
    const steps: ObservationEvent[] = [
      { type: "step-done" },
      { type: "open-breach" },
      {
        type: "record-breach",
        breach: { kind: "out_of_order", cause: "technique", spaceProblem: null, note: null },
      },
      { type: "step-done" },
      { type: "step-done" },
      { type: "step-done" },
    ];
    const beforeCoaching = run([...ready, ...steps]);
    expect(observationBody(beforeCoaching, at(9))).toBeNull();
    const draft = run([
      ...ready,
      ...steps,
      { type: "coaching", given: true, note: " showed the glove-in-glove technique " },
      { type: "coaching-done" },
    ]);
    expect(draft.phase).toBe("summary");
    const body = observationBody(draft, at(9))!;
    expect(body).toMatchObject({
      spaceId: doffingAreaSpaceId,
      staffCode: "RN-204",
      staffRole: "nurse",
      startedAt: at(0).toISOString(),
      finishedAt: at(9).toISOString(),
      precheck: [
        { key: "waste_not_overfull", ok: true },
        { key: "hand_rub_within_reach", ok: false },
        { key: "sides_marked", ok: true },
      ],
      coachingGiven: true,
      coachingNote: "showed the glove-in-glove technique",
    });
    expect(body.steps).toHaveLength(5);
    expect(outcomeOnPhone(draft)).toMatchObject({
      outcome: "breaches_seen",
      breachCount: 1,
      breachedSteps: [2],
      handHygiene: { performed: 1, expected: 1 },
    });
  });

  it("when coaching was not given, then no coaching note is sent even if one was typed", () => {
    const draft = run([
      ...ready,
      ...Array.from({ length: 5 }, () => ({ type: "step-done" }) as const),
      { type: "coaching", given: true, note: "typed first" },
      { type: "coaching", given: false, note: "typed first" },
      { type: "coaching-done" },
    ]);
    expect(observationBody(draft, at(5))).toMatchObject({
      coachingGiven: false,
      coachingNote: null,
    });
    expect(outcomeOnPhone(draft)).toMatchObject({ outcome: "clean_run", breachCount: 0 });
  });
});
