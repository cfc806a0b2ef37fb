import { z } from "zod";

import { zoneTypes } from "../zones";
import { proportionSchema } from "./committee";
import { requiredText, responseText, text, uuidSchema } from "./common";

/**
 * Observed putting-on and removal of PPE: a trained observer reads each step of a sequence aloud,
 * watches it done and records breaches. An observation names the person observed only by a
 * staff code and role: Lintel stores no names and no photos of observed staff.
 */

/** What a sequence is for: putting PPE on, or taking it off. */
export const sequenceKinds = ["putting_on", "removal"] as const;
export type SequenceKind = (typeof sequenceKinds)[number];

/** The zone types where an observation can take place. */
export const observedZoneTypes = [
  "donning_zone",
  "doffing_area",
  "anteroom",
] as const satisfies readonly (typeof zoneTypes)[number][];

/** What went wrong at a step. */
export const breachKinds = [
  "out_of_order",
  "step_skipped",
  "hand_hygiene_missed",
  "touched_face_or_clean_clothing",
  "item_dropped_or_wrong_container",
  "assistant_needed",
] as const;
export type BreachKind = (typeof breachKinds)[number];

/** Why: the person's technique, or something about the space itself. */
export const breachCauses = ["technique", "space"] as const;
export type BreachCause = (typeof breachCauses)[number];

/** When the space is the cause, what about it; each maps to a checklist item of the space. */
export const spaceProblems = [
  "no_hand_rub_within_reach",
  "bin_full",
  "no_clean_dirty_separation",
] as const;
export type SpaceProblem = (typeof spaceProblems)[number];

/** A staff member's role, as the observer records it (never a name). */
export const staffRoles = [
  "nurse",
  "doctor",
  "healthcare_assistant",
  "therapist",
  "cleaning_staff",
  "porter",
  "student",
  "other",
] as const;
export type StaffRole = (typeof staffRoles)[number];

/** A staff code: letters, digits and dashes, as a site issues them. Never a name. */
export const staffCodeSchema = text()
  .trim()
  .toUpperCase()
  .regex(/^[A-Z0-9][A-Z0-9-]{1,15}$/, {
    message: "A staff code of 2 to 16 letters, digits or dashes, not a name.",
  });

export const sequenceStepSchema = z.object({
  id: uuidSchema,
  /** Stable across versions. */
  key: responseText(),
  position: z.number().int(),
  /** What the observer reads aloud. */
  text: responseText(),
  /** Whether the step includes a hand-hygiene moment (expected to be performed). */
  handHygiene: z.boolean(),
  /** The breaches to watch for at this step. */
  watchFor: z.array(z.enum(breachKinds)),
  /** The published source, or "Common practice" / "Lintel's draft, common practice". */
  reference: responseText().nullable(),
});
export type SequenceStep = z.infer<typeof sequenceStepSchema>;

export const sequenceVersionSchema = z.object({
  id: uuidSchema,
  /** Stable across versions: "standard-putting-on", "standard-removal-1", … */
  key: responseText(),
  kind: z.enum(sequenceKinds),
  version: z.number().int(),
  status: z.enum(["draft", "published"]),
  title: responseText(),
  /** Shown beside the title, e.g. that a sequence is Lintel's draft from common practice. */
  note: responseText().nullable(),
  publishedAt: responseText().nullable(),
  steps: z.array(sequenceStepSchema),
});
export type SequenceVersion = z.infer<typeof sequenceVersionSchema>;

export const sequencesResponseSchema = z.object({
  sequences: z.array(
    z.object({
      key: responseText(),
      published: sequenceVersionSchema.nullable(),
      draft: sequenceVersionSchema.nullable(),
    }),
  ),
});
export type SequencesResponse = z.infer<typeof sequencesResponseSchema>;

/** One step of a draft; omit `key` for a new step, keep it when rewording an existing one. */
export const draftStepSchema = z.strictObject({
  key: text().trim().min(1).max(60, { message: "At most 60 characters." }).optional(),
  text: requiredText(300),
  handHygiene: z.boolean({ message: "Say whether this step includes hand hygiene." }),
  watchFor: z.array(z.enum(breachKinds, { message: "Choose a kind of breach." })).max(6),
  reference: text().trim().max(300, { message: "At most 300 characters." }).nullable().optional(),
});

export const sequenceDraftBodySchema = z.strictObject({
  title: requiredText(120),
  kind: z.enum(sequenceKinds, { message: "Choose putting on or removal." }),
  note: text().trim().max(300, { message: "At most 300 characters." }).nullable().optional(),
  steps: z.array(draftStepSchema).min(1, { message: "At least one step." }).max(40),
});
export type SequenceDraftBody = z.infer<typeof sequenceDraftBodySchema>;

export const sequenceParamsSchema = z.strictObject({
  key: text()
    .trim()
    .regex(/^[a-z0-9-]{1,60}$/, { message: "A sequence key such as standard-removal-1." }),
});

/** The area checked before the observation starts. */
export const precheckKeys = [
  "waste_not_overfull",
  "hand_rub_within_reach",
  "sides_marked",
] as const;
export type PrecheckKey = (typeof precheckKeys)[number];

export const breachSchema = z
  .strictObject({
    kind: z.enum(breachKinds, { message: "Choose what went wrong." }),
    cause: z.enum(breachCauses, { message: "Choose technique or the space." }),
    /** Required when the cause is the space. */
    spaceProblem: z.enum(spaceProblems, { message: "Choose what about the space." }).nullable(),
    note: text().trim().max(500, { message: "At most 500 characters." }).nullable(),
  })
  .refine((breach) => (breach.cause === "space") === (breach.spaceProblem !== null), {
    message: "Say what about the space caused it (and only when the space is the cause).",
    path: ["spaceProblem"],
  });
export type Breach = z.infer<typeof breachSchema>;

export const stepRecordSchema = z.strictObject({
  stepId: uuidSchema,
  /** Done as read; false when the step was not done at all (a "step skipped" breach says so). */
  done: z.boolean(),
  breaches: z.array(breachSchema).max(6),
});
export type StepRecord = z.infer<typeof stepRecordSchema>;

/**
 * The whole observation, sent once it is finished (from the phone's queue, with the id the phone
 * made). Sending it again with the same content changes nothing.
 */
export const observationBodySchema = z.strictObject({
  spaceId: uuidSchema,
  sequenceVersionId: uuidSchema,
  staffCode: staffCodeSchema,
  staffRole: z.enum(staffRoles, { message: "Choose the role of the person observed." }),
  startedAt: z.iso.datetime({ offset: true, message: "A date and time." }),
  finishedAt: z.iso.datetime({ offset: true, message: "A date and time." }),
  precheck: z
    .array(z.strictObject({ key: z.enum(precheckKeys), ok: z.boolean() }))
    .max(precheckKeys.length),
  steps: z.array(stepRecordSchema).min(1).max(40),
  coachingGiven: z.boolean(),
  coachingNote: text().trim().max(500, { message: "At most 500 characters." }).nullable(),
});
export type ObservationBody = z.infer<typeof observationBodySchema>;

export const observationParamsSchema = z.strictObject({ observationId: uuidSchema });

/** The outcome as Lintel decides it on the server (see shared/calc/observation-outcome.ts). */
export const observationOutcomes = ["clean_run", "breaches_seen"] as const;
export type ObservationOutcome = (typeof observationOutcomes)[number];

export const observationSchema = z.object({
  id: uuidSchema,
  siteId: uuidSchema,
  spaceId: uuidSchema,
  spaceName: responseText(),
  zoneType: z.enum(zoneTypes),
  sequenceVersionId: uuidSchema,
  sequenceTitle: responseText(),
  sequenceKind: z.enum(sequenceKinds),
  observerId: uuidSchema,
  /** Shown only to that site's auditors and administrators; null for everyone else. */
  staffCode: responseText().nullable(),
  staffRole: z.enum(staffRoles),
  startedAt: responseText(),
  finishedAt: responseText(),
  outcome: z.enum(observationOutcomes),
  breachCount: z.number().int(),
  /** Positions (1-based) of the steps with at least one breach. */
  breachedSteps: z.array(z.number().int()),
  handHygiene: z.object({ performed: z.number().int(), expected: z.number().int() }),
  coachingGiven: z.boolean(),
  /** Findings opened or joined for breaches caused by the space. */
  findings: z.array(z.object({ itemKey: responseText(), actionId: uuidSchema })),
});
export type Observation = z.infer<typeof observationSchema>;

/** Committee figures on observations, per site and for the network. */
/** Fewer distinct staff codes than this behind a figure and the figure is withheld. */
export const minimumStaffCodes = 5;

/** A proportion that is withheld (all counts 0, rate and interval null) when `suppressed`. */
const suppressibleProportionSchema = proportionSchema.extend({ suppressed: z.boolean() });

export const stepBreachRateSchema = z.object({
  sequenceKey: responseText(),
  /** The sequence's title in its newest version observed. */
  sequenceTitle: responseText(),
  stepKey: responseText(),
  stepText: responseText(),
  /** Observations with a breach at this step out of observations of the sequence with this step. */
  breached: proportionSchema,
  /** True when the step's observations describe fewer than 5 staff codes: `breached` is withheld. */
  suppressed: z.boolean(),
});
export type StepBreachRate = z.infer<typeof stepBreachRateSchema>;

export const observationFiguresSchema = z.object({
  /** Observations in the period (counted even when the figures are withheld). */
  observations: z.number().int(),
  /**
   * True when the cell describes fewer than 5 staff codes: every figure below is withheld (steps
   * empty, proportions with no counts), only the number of observations and the months stay.
   */
  suppressed: z.boolean(),
  /** One row per step of each sequence observed, by sequence then the step's position. */
  steps: z.array(stepBreachRateSchema),
  /** The five steps with the highest breach rate (ranked only with enough observations). */
  mostErrorProne: z.array(stepBreachRateSchema),
  /** Observations with every hand-hygiene moment performed, out of observations with a moment. */
  handHygieneAllMoments: suppressibleProportionSchema,
  /** Moments performed ÷ moments expected (no interval: moments in one observation are not independent). */
  handHygieneMomentRate: z.number().nullable(),
  perMonth: z.array(z.object({ month: responseText(), observations: z.number().int() })),
  /**
   * Staff codes coached and observed again at the same site in the period whose next observation
   * was clean (one per staff code: the first coaching followed by another observation).
   */
  cleanAfterCoaching: suppressibleProportionSchema,
});
export type ObservationFigures = z.infer<typeof observationFiguresSchema>;

export const observationCommitteeResponseSchema = z.object({
  from: responseText(),
  to: responseText(),
  confidence: z.number(),
  minimumRankedSample: z.number().int(),
  /** Cells describing fewer staff codes than this are suppressed. */
  minimumStaffCodes: z.number().int(),
  network: observationFiguresSchema,
  sites: z.array(observationFiguresSchema.extend({ siteId: uuidSchema, siteName: responseText() })),
});
export type ObservationCommitteeResponse = z.infer<typeof observationCommitteeResponseSchema>;

/** How long a network keeps observation detail (staff codes, notes, breaches, pre-check). */
export const defaultRetentionDays = 730;
export const observationSettingsBodySchema = z.strictObject({
  retentionDays: z
    .number({ message: "A number of days." })
    .int({ message: "A whole number of days." })
    .min(30, { message: "At least 30 days." })
    .max(3650, { message: "At most 3650 days (ten years)." }),
});
export type ObservationSettingsBody = z.infer<typeof observationSettingsBodySchema>;
export const observationSettingsSchema = z.object({ retentionDays: z.number().int() });
export type ObservationSettings = z.infer<typeof observationSettingsSchema>;
