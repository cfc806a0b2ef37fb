import { type ObservationResult, observationOutcome } from "@shared/calc/observation-outcome";
import type { ZoneType } from "@shared/zones";
import {
  type Breach,
  type ObservationBody,
  observedZoneTypes,
  type PrecheckKey,
  precheckKeys,
  type SequenceKind,
  type SequenceVersion,
  staffCodeSchema,
  type StaffRole,
  type StepRecord,
} from "@shared/schemas/observations";

/**
 * An observation of putting on or removing PPE as the phone holds it while the observer records it:
 * the space, the sequence (the version chosen, kept whole so it runs with no signal), the person
 * observed (a staff code and role, never a name), the area's pre-check, one record per step and
 * the coaching given. Every change goes through `observationReducer`, and the whole draft is
 * written to the person's store on the phone after each one.
 */

export type ObservationPhase = "setup" | "precheck" | "steps" | "breach" | "coaching" | "summary";

export interface ObservationDraft {
  observationId: string;
  spaceId: string;
  spaceName: string | null;
  zoneType: ZoneType | null;
  sequence: SequenceVersion | null;
  staffCode: string;
  staffRole: StaffRole | null;
  /** Set when the observer begins the pre-check. */
  startedAt: string | null;
  precheck: Record<PrecheckKey, boolean | null>;
  /** One per step of the sequence, filled as the observer goes. */
  steps: (StepRecord | null)[];
  /** The step on screen (index into the sequence's steps). */
  stepIndex: number;
  coachingGiven: boolean | null;
  coachingNote: string;
  phase: ObservationPhase;
}

export type ObservationEvent =
  | { type: "choose-sequence"; sequence: SequenceVersion }
  | { type: "set-person"; staffCode: string; staffRole: StaffRole | null }
  | { type: "begin"; now: Date }
  | { type: "precheck"; key: PrecheckKey; ok: boolean }
  | { type: "precheck-done" }
  | { type: "step-done" }
  | { type: "open-breach" }
  | { type: "cancel-breach" }
  | { type: "record-breach"; breach: Breach }
  | { type: "back" }
  | { type: "coaching"; given: boolean; note: string }
  | { type: "coaching-done" };

export function newObservationDraft(input: {
  observationId: string;
  spaceId: string;
  spaceName: string | null;
  zoneType: ZoneType | null;
}): ObservationDraft {
  return {
    ...input,
    sequence: null,
    staffCode: "",
    staffRole: null,
    startedAt: null,
    precheck: { waste_not_overfull: null, hand_rub_within_reach: null, sides_marked: null },
    steps: [],
    stepIndex: 0,
    coachingGiven: null,
    coachingNote: "",
    phase: "setup",
  };
}

/** Which kinds of sequence fit a zone: putting on in a donning zone, removal in a doffing area, both in an anteroom. */
export function sequenceKindsFor(zoneType: ZoneType | null): SequenceKind[] {
  if (zoneType === "donning_zone") return ["putting_on"];
  if (zoneType === "doffing_area") return ["removal"];
  return ["putting_on", "removal"];
}

export function isObservedZone(zoneType: ZoneType | null | undefined): boolean {
  return (observedZoneTypes as readonly string[]).includes(zoneType ?? "");
}

/** Why the observer cannot begin yet, or null. */
export function setupProblem(draft: ObservationDraft): string | null {
  if (!draft.sequence) return "Choose the sequence to observe.";
  if (!staffCodeSchema.safeParse(draft.staffCode).success)
    return "Enter the staff code: 2 to 16 letters, digits or dashes, not a name.";
  if (!draft.staffRole) return "Choose the role of the person observed.";
  return null;
}

export function precheckComplete(draft: ObservationDraft): boolean {
  return precheckKeys.every((key) => draft.precheck[key] !== null);
}

/** Whether a breach means the step was not done at all. */
const notDone = (breaches: readonly Breach[]) =>
  breaches.some((breach) => breach.kind === "step_skipped");

function withStep(draft: ObservationDraft, record: StepRecord): ObservationDraft {
  const steps = [...draft.steps];
  steps[draft.stepIndex] = record;
  const total = draft.sequence?.steps.length ?? 0;
  const last = draft.stepIndex >= total - 1;
  return {
    ...draft,
    steps,
    stepIndex: last ? draft.stepIndex : draft.stepIndex + 1,
    phase: last ? "coaching" : "steps",
  };
}

export function observationReducer(
  draft: ObservationDraft,
  event: ObservationEvent,
): ObservationDraft {
  switch (event.type) {
    case "choose-sequence":
      if (draft.phase !== "setup") return draft;
      return { ...draft, sequence: event.sequence, steps: event.sequence.steps.map(() => null) };
    case "set-person":
      if (draft.phase !== "setup") return draft;
      return { ...draft, staffCode: event.staffCode, staffRole: event.staffRole };
    case "begin":
      if (draft.phase !== "setup" || setupProblem(draft)) return draft;
      return {
        ...draft,
        staffCode: staffCodeSchema.parse(draft.staffCode),
        startedAt: draft.startedAt ?? event.now.toISOString(),
        phase: "precheck",
      };
    case "precheck":
      if (draft.phase !== "precheck") return draft;
      return { ...draft, precheck: { ...draft.precheck, [event.key]: event.ok } };
    case "precheck-done":
      if (draft.phase !== "precheck" || !precheckComplete(draft)) return draft;
      return { ...draft, phase: "steps", stepIndex: 0 };
    case "step-done": {
      if (draft.phase !== "steps" || !draft.sequence) return draft;
      const stepId = draft.sequence.steps[draft.stepIndex]!.id;
      return withStep(draft, { stepId, done: true, breaches: [] });
    }
    case "open-breach":
      return draft.phase === "steps" ? { ...draft, phase: "breach" } : draft;
    case "cancel-breach":
      return draft.phase === "breach" ? { ...draft, phase: "steps" } : draft;
    case "record-breach": {
      if (draft.phase !== "breach" || !draft.sequence) return draft;
      const stepId = draft.sequence.steps[draft.stepIndex]!.id;
      const breach: Breach = {
        ...event.breach,
        spaceProblem: event.breach.cause === "space" ? event.breach.spaceProblem : null,
        note: event.breach.note?.trim() ? event.breach.note.trim() : null,
      };
      const breaches = [breach];
      return withStep(draft, { stepId, done: !notDone(breaches), breaches });
    }
    case "back":
      if (draft.phase === "breach") return { ...draft, phase: "steps" };
      if (draft.phase === "steps") {
        return draft.stepIndex === 0
          ? { ...draft, phase: "precheck" }
          : { ...draft, stepIndex: draft.stepIndex - 1 };
      }
      if (draft.phase === "coaching") return { ...draft, phase: "steps" };
      if (draft.phase === "summary") return { ...draft, phase: "coaching" };
      if (draft.phase === "precheck") return { ...draft, phase: "setup" };
      return draft;
    case "coaching":
      if (draft.phase !== "coaching") return draft;
      return { ...draft, coachingGiven: event.given, coachingNote: event.note };
    case "coaching-done":
      if (draft.phase !== "coaching" || draft.coachingGiven === null) return draft;
      return { ...draft, phase: "summary" };
  }
}

/** Breaches recorded so far, with the 1-based position of their step. */
export function breachesSoFar(draft: ObservationDraft): { position: number; breach: Breach }[] {
  return draft.steps.flatMap((record, index) =>
    (record?.breaches ?? []).map((breach) => ({ position: index + 1, breach })),
  );
}

/** The body sent to Lintel once the observer taps "Finish"; null until every step is recorded. */
export function observationBody(draft: ObservationDraft, finishedAt: Date): ObservationBody | null {
  if (!draft.sequence || !draft.staffRole || !draft.startedAt || draft.coachingGiven === null)
    return null;
  if (draft.steps.length === 0 || draft.steps.some((record) => record === null)) return null;
  return {
    spaceId: draft.spaceId,
    sequenceVersionId: draft.sequence.id,
    staffCode: draft.staffCode,
    staffRole: draft.staffRole,
    startedAt: draft.startedAt,
    finishedAt: finishedAt.toISOString(),
    precheck: precheckKeys.map((key) => ({ key, ok: draft.precheck[key] === true })),
    steps: draft.steps as StepRecord[],
    coachingGiven: draft.coachingGiven,
    coachingNote:
      draft.coachingGiven && draft.coachingNote.trim() ? draft.coachingNote.trim() : null,
  };
}

/**
 * The outcome as the phone decides it with Lintel's own rule (the server decides again and its
 * answer is shown once it arrives): a clean run, or breaches seen at which steps.
 */
export function outcomeOnPhone(draft: ObservationDraft): ObservationResult | null {
  if (!draft.sequence) return null;
  return observationOutcome(
    draft.sequence.steps,
    draft.steps.filter((record): record is StepRecord => record !== null),
  );
}
