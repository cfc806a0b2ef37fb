import type { BreachKind, ObservationOutcome } from "../schemas/observations";

/**
 * What an observation came to, decided from the sequence's steps and what the observer recorded
 * at each. Pure: the server stores what these return, and the committee's figures count them.
 */

export interface OutcomeStep {
  id: string;
  /** 1-based position in the sequence. */
  position: number;
  /** Whether hand hygiene is expected at this step (one moment). */
  handHygiene: boolean;
}

export interface OutcomeRecord {
  stepId: string;
  done: boolean;
  breaches: readonly { kind: BreachKind }[];
}

export interface StepResult {
  stepId: string;
  position: number;
  done: boolean;
  breached: boolean;
}

export interface ObservationResult {
  outcome: ObservationOutcome;
  breachCount: number;
  /** Positions (1-based, ascending) of the steps with at least one breach. */
  breachedSteps: number[];
  handHygiene: HandHygieneMoments;
  steps: StepResult[];
}

export interface HandHygieneMoments {
  performed: number;
  expected: number;
}

/**
 * Breaches at one step. A step not done counts as skipped even when the observer recorded no
 * breach there (the server refuses that, but the count never depends on it).
 */
export function breachesAtStep(record: OutcomeRecord | undefined): number {
  if (!record) return 1;
  return Math.max(record.breaches.length, record.done ? 0 : 1);
}

/**
 * Hand-hygiene moments: one is expected at each step that includes hand hygiene, and performed
 * unless that step was not done or has a "hand hygiene missed" breach. Other breaches at the
 * step (an item dropped, say) do not undo the hand hygiene itself.
 */
export function handHygieneMoments(
  steps: readonly OutcomeStep[],
  records: readonly OutcomeRecord[],
): HandHygieneMoments {
  const byStep = new Map(records.map((record) => [record.stepId, record]));
  let expected = 0;
  let performed = 0;
  for (const step of steps) {
    if (!step.handHygiene) continue;
    expected += 1;
    const record = byStep.get(step.id);
    if (!record || !record.done) continue;
    if (record.breaches.some((breach) => breach.kind === "hand_hygiene_missed")) continue;
    performed += 1;
  }
  return { performed, expected };
}

/** Performed ÷ expected, or null when the sequence expects no moment. */
export function handHygieneCompliance(moments: HandHygieneMoments): number | null {
  return moments.expected === 0 ? null : moments.performed / moments.expected;
}

/**
 * The outcome: a clean run when every step was done with no breach; otherwise breaches seen, with
 * how many and at which steps. A step with no record counts as not done.
 */
export function observationOutcome(
  steps: readonly OutcomeStep[],
  records: readonly OutcomeRecord[],
): ObservationResult {
  const byStep = new Map(records.map((record) => [record.stepId, record]));
  const ordered = [...steps].sort((a, b) => a.position - b.position);
  const results: StepResult[] = ordered.map((step) => {
    const record = byStep.get(step.id);
    return {
      stepId: step.id,
      position: step.position,
      done: record?.done ?? false,
      breached: breachesAtStep(record) > 0,
    };
  });
  const breachCount = ordered.reduce((sum, step) => sum + breachesAtStep(byStep.get(step.id)), 0);
  return {
    outcome: breachCount === 0 ? "clean_run" : "breaches_seen",
    breachCount,
    breachedSteps: results.filter((step) => step.breached).map((step) => step.position),
    handHygiene: handHygieneMoments(steps, records),
    steps: results,
  };
}
