import type {
  BreachCause,
  BreachKind,
  ObservationOutcome,
  PrecheckKey,
  SequenceKind,
  SpaceProblem,
  StaffRole,
} from "../schemas/observations";

/** Lintel's words for what the observer records. */
export const sequenceKindLabels: Record<SequenceKind, string> = {
  putting_on: "Putting on",
  removal: "Removal",
};

export const breachKindLabels: Record<BreachKind, string> = {
  out_of_order: "Out of order",
  step_skipped: "Step skipped",
  hand_hygiene_missed: "Hand hygiene missed",
  touched_face_or_clean_clothing: "Touched face or clean clothing with a contaminated hand",
  item_dropped_or_wrong_container: "Item dropped or not into the right container",
  assistant_needed: "Assistant needed",
};

export const breachCauseLabels: Record<BreachCause, string> = {
  technique: "The person's technique",
  space: "The space",
};

export const spaceProblemLabels: Record<SpaceProblem, string> = {
  no_hand_rub_within_reach: "No hand rub within reach",
  bin_full: "Bin full",
  no_clean_dirty_separation: "No clean/dirty separation",
};

export const staffRoleLabels: Record<StaffRole, string> = {
  nurse: "Nurse",
  doctor: "Doctor",
  healthcare_assistant: "Healthcare assistant",
  therapist: "Therapist",
  cleaning_staff: "Cleaning staff",
  porter: "Porter",
  student: "Student",
  other: "Other",
};

export const precheckLabels: Record<PrecheckKey, string> = {
  waste_not_overfull: "Waste container not over-full",
  hand_rub_within_reach: "Hand rub within reach",
  sides_marked: "Clean and dirty sides marked",
};

/** "2 breaches, at steps 1 and 4", or that none was seen. */
export function describeBreaches(positions: readonly number[], count: number): string {
  if (count === 0) return "No breach seen";
  const steps = [...new Set(positions)].sort((a, b) => a - b);
  const where =
    steps.length === 1
      ? `at step ${steps[0]}`
      : `at steps ${steps.slice(0, -1).join(", ")} and ${steps[steps.length - 1]}`;
  return `${count} ${count === 1 ? "breach" : "breaches"}, ${where}`;
}

/** Lintel's names for what an observation came to. */
export const observationOutcomeLabels: Record<ObservationOutcome, string> = {
  clean_run: "Clean run",
  breaches_seen: "Breaches seen",
};
