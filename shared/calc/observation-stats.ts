import { minimumRankedSample, monthsBetween, type Proportion } from "../schemas/committee";
import {
  minimumStaffCodes,
  type ObservationFigures,
  type StepBreachRate,
} from "../schemas/observations";
import { proportion } from "./proportion";

/**
 * The committee's figures on observed putting-on and removal, from counts the database tallies per
 * site. The observation is the unit: each step counts once per observation however many breaches
 * it had, and hand hygiene is judged per observation (every moment performed or not).
 *
 * Staff codes belong to a site: the same code at two sites is two people, so counts of distinct
 * codes add up across sites. After the retention period an observation keeps its counts but loses
 * its staff code: such observations still count in every rate, but they cannot be told apart, so
 * they stand for one person at most when deciding whether a cell describes enough people.
 */

/** How many people a group of observations describes, at least. */
export interface StaffCount {
  /** Distinct staff codes still held. */
  staffCodes: number;
  /** Observations whose staff code is gone after retention. */
  withoutCode: number;
}

export interface StepTally extends StaffCount {
  sequenceKey: string;
  sequenceTitle: string;
  stepKey: string;
  stepText: string;
  /** The step's position in its sequence's newest version observed (for the order of rows). */
  position: number;
  /** Observations of the sequence that had this step. */
  observations: number;
  /** Of those, observations with at least one breach at this step. */
  breached: number;
}

/** One site's counts over the period. */
export interface SiteObservationTally extends StaffCount {
  observations: number;
  steps: StepTally[];
  handHygiene: StaffCount & {
    /** Observations with at least one hand-hygiene moment expected. */
    observations: number;
    /** Of those, observations with every moment performed. */
    allMoments: number;
    performed: number;
    expected: number;
  };
  perMonth: { month: string; observations: number }[];
  /** Staff codes coached, then observed again; and of those, how many next time were clean. */
  afterCoaching: { staffCodes: number; clean: number };
}

/** The fewest distinct people a group of observations can describe. */
export function peopleAtLeast(count: StaffCount): number {
  return Math.max(count.staffCodes, count.withoutCode > 0 ? 1 : 0);
}

/** A cell with observations behind it that describes fewer than `minimumStaffCodes` people. */
export function isSuppressed(observations: number, count: StaffCount): boolean {
  return observations > 0 && peopleAtLeast(count) < minimumStaffCodes;
}

/** A proportion whose figures are withheld: no counts, no rate, no interval. */
const noFigures = (): Proportion => ({
  n: 0,
  successes: 0,
  rate: null,
  interval: null,
  smallSample: true,
});

export const withheld = (): Proportion & { suppressed: true } => ({
  ...noFigures(),
  suppressed: true,
});

/** Every month from `from` to `to` (YYYY-MM), in order. */
export function monthsOf(from: string, to: string): string[] {
  const [year, month] = from.split("-").map(Number) as [number, number];
  return Array.from({ length: Math.max(0, monthsBetween(from, to)) }, (_, index) => {
    const date = new Date(Date.UTC(year, month - 1 + index, 1));
    return date.toISOString().slice(0, 7);
  });
}

/** The rate of one step, withheld when its observations describe fewer than 5 staff codes. */
export function stepBreachRate(step: StepTally): StepBreachRate {
  const suppressed = isSuppressed(step.observations, step);
  return {
    sequenceKey: step.sequenceKey,
    sequenceTitle: step.sequenceTitle,
    stepKey: step.stepKey,
    stepText: step.stepText,
    breached: suppressed ? noFigures() : proportion(step.breached, step.observations),
    suppressed,
  };
}

/**
 * The five steps with the highest breach rate, among steps with at least one breach, enough
 * observations to rank (`minimumRankedSample`) and figures not withheld. Ties go to the step whose
 * interval's lower bound is higher (the surer figure), then to sequence and step order.
 */
export function mostErrorProne(steps: readonly StepBreachRate[], count = 5): StepBreachRate[] {
  return steps
    .map((step, order) => ({ step, order }))
    .filter(
      ({ step }) =>
        !step.suppressed && step.breached.n >= minimumRankedSample && step.breached.successes > 0,
    )
    .sort(
      (a, b) =>
        b.step.breached.rate! - a.step.breached.rate! ||
        b.step.breached.interval!.lower - a.step.breached.interval!.lower ||
        a.order - b.order,
    )
    .slice(0, count)
    .map(({ step }) => step);
}

/** A site's (or the network's) figures from its counts, for the months of the period. */
export function observationFigures(
  tally: SiteObservationTally,
  months: readonly string[],
): ObservationFigures {
  const counted = new Map(tally.perMonth.map((row) => [row.month, row.observations]));
  const perMonth = months.map((month) => ({ month, observations: counted.get(month) ?? 0 }));
  if (isSuppressed(tally.observations, tally))
    return {
      observations: tally.observations,
      suppressed: true,
      steps: [],
      mostErrorProne: [],
      handHygieneAllMoments: withheld(),
      handHygieneMomentRate: null,
      perMonth,
      cleanAfterCoaching: withheld(),
    };

  const steps = [...tally.steps]
    .sort(
      (a, b) =>
        a.sequenceKey.localeCompare(b.sequenceKey) ||
        a.position - b.position ||
        a.stepKey.localeCompare(b.stepKey),
    )
    .map(stepBreachRate);
  const hand = tally.handHygiene;
  const handSuppressed = isSuppressed(hand.observations, hand);
  const coached = tally.afterCoaching;
  // One row per staff code: the cell describes exactly that many people.
  const coachedSuppressed = coached.staffCodes > 0 && coached.staffCodes < minimumStaffCodes;
  return {
    observations: tally.observations,
    suppressed: false,
    steps,
    mostErrorProne: mostErrorProne(steps),
    handHygieneAllMoments: handSuppressed
      ? withheld()
      : { ...proportion(hand.allMoments, hand.observations), suppressed: false },
    handHygieneMomentRate:
      handSuppressed || hand.expected === 0 ? null : hand.performed / hand.expected,
    perMonth,
    cleanAfterCoaching: coachedSuppressed
      ? withheld()
      : { ...proportion(coached.clean, coached.staffCodes), suppressed: false },
  };
}

/**
 * The network's counts: every site's added together. Distinct staff codes add up because a code
 * belongs to its site; a step is the same step across sites when its sequence and step keys match.
 */
export function networkTally(sites: readonly SiteObservationTally[]): SiteObservationTally {
  const steps = new Map<string, StepTally>();
  const months = new Map<string, number>();
  const total: SiteObservationTally = {
    observations: 0,
    staffCodes: 0,
    withoutCode: 0,
    steps: [],
    handHygiene: {
      observations: 0,
      allMoments: 0,
      performed: 0,
      expected: 0,
      staffCodes: 0,
      withoutCode: 0,
    },
    perMonth: [],
    afterCoaching: { staffCodes: 0, clean: 0 },
  };
  for (const site of sites) {
    total.observations += site.observations;
    total.staffCodes += site.staffCodes;
    total.withoutCode += site.withoutCode;
    for (const key of Object.keys(total.handHygiene) as (keyof typeof total.handHygiene)[])
      total.handHygiene[key] += site.handHygiene[key];
    total.afterCoaching.staffCodes += site.afterCoaching.staffCodes;
    total.afterCoaching.clean += site.afterCoaching.clean;
    for (const row of site.perMonth)
      months.set(row.month, (months.get(row.month) ?? 0) + row.observations);
    for (const step of site.steps) {
      const key = `${step.sequenceKey}\u0000${step.stepKey}`;
      const sum = steps.get(key);
      if (!sum) {
        steps.set(key, { ...step });
        continue;
      }
      sum.observations += step.observations;
      sum.breached += step.breached;
      sum.staffCodes += step.staffCodes;
      sum.withoutCode += step.withoutCode;
    }
  }
  total.steps = [...steps.values()];
  total.perMonth = [...months].map(([month, observations]) => ({ month, observations }));
  return total;
}
