import { z } from "zod";

import { verdicts } from "../calc/verdict";
import { zoneTypes } from "../zones";
import { checklistItemSchema } from "./checklists";
import { numberInput, text, uuidSchema, responseText } from "./common";

import { readingUnits } from "../calc/answer-rules";

export { readingUnits, type ReadingUnit } from "../calc/answer-rules";

export const outcomes = ["pass", "fail", "not_applicable"] as const;

export const auditParamsSchema = z.strictObject({ auditId: uuidSchema });
export const auditItemParamsSchema = z.strictObject({ auditId: uuidSchema, itemId: uuidSchema });

/** Starting (or resuming) an audit: the id is made by the device, so a retried request is harmless. */
export const startAuditBodySchema = z.strictObject({
  spaceId: uuidSchema,
  startedAt: z.iso.datetime({ offset: true, message: "A date and time with its offset." }),
  /**
   * The checklist version the phone began with (it may have been offline while the checklist was
   * republished). Without it, the version published when the server hears of the audit.
   */
  checklistVersionId: uuidSchema.optional(),
});
export type StartAuditBody = z.infer<typeof startAuditBodySchema>;

/** The text fields of a multipart audit photo (the file itself is `photo`). */
export const auditPhotoFieldsSchema = z.strictObject({
  /** Made by the device; the same photo sent twice is stored once. */
  id: uuidSchema,
  itemId: uuidSchema.nullable().optional(),
});

export const answerBodySchema = z.strictObject({
  /** Made by the device; the same answer sent twice is stored once. */
  id: uuidSchema,
  outcome: z.enum(outcomes, { message: "Choose pass, fail or not applicable." }).nullable(),
  value: numberInput().nullable().optional(),
  unit: z
    .enum(readingUnits, {
      message: "Choose one of the units the form offers, such as Pa or inches of water.",
    })
    .nullable()
    .optional(),
  count: numberInput()
    .int({ message: "A whole number." })
    .min(0, { message: "Zero or more." })
    .max(10_000)
    .nullable()
    .optional(),
  choice: text().max(40).nullable().optional(),
  note: text().trim().max(2000, { message: "At most 2000 characters." }).nullable().optional(),
});
export type AnswerBody = z.infer<typeof answerBodySchema>;

export const answerSchema = z.object({
  id: uuidSchema,
  itemId: uuidSchema,
  outcome: z.enum(outcomes).nullable(),
  /** SI value: Pa, m³/h, percent, air changes per hour, minutes. */
  value: z.number().nullable(),
  /** The unit the auditor entered, to show the value the same way. */
  unit: z.enum(readingUnits).nullable(),
  /** The reading as entered, in `unit`: thresholds are met in the unit a reading was entered in. */
  enteredValue: z.number().nullable().optional(),
  count: z.number().nullable(),
  choice: responseText().nullable(),
  note: responseText().nullable(),
});
export type Answer = z.infer<typeof answerSchema>;

export const auditPhotoSchema = z.object({
  id: uuidSchema,
  itemId: uuidSchema.nullable(),
  imageId: uuidSchema,
});

export const auditSchema = z.object({
  id: uuidSchema,
  siteId: uuidSchema,
  spaceId: uuidSchema,
  spaceName: responseText(),
  zoneType: z.enum(zoneTypes),
  /** When the audited space was retired; its history stays readable. */
  spaceRetiredAt: responseText().nullable().default(null),
  checklistVersionId: uuidSchema,
  checklistVersion: z.number().int(),
  auditorId: uuidSchema,
  auditorName: responseText(),
  status: z.enum(["draft", "submitted"]),
  startedAt: responseText(),
  submittedAt: responseText().nullable(),
  verdict: z.enum(verdicts).nullable(),
  /** Weighted pass rate in [0, 1]. */
  score: z.number().nullable(),
  /** The version of the readiness rules that decided the verdict; null while a draft. */
  rulesVersion: z.number().int().nullable().optional(),
  /** Why the verdict, in words; null for verdicts decided before reasons were kept. */
  verdictReasons: z.array(responseText()).nullable().optional(),
});
export type Audit = z.infer<typeof auditSchema>;

export const auditDetailSchema = z.object({
  audit: auditSchema,
  items: z.array(checklistItemSchema),
  answers: z.array(answerSchema),
  photos: z.array(auditPhotoSchema),
  /** For isolation rooms: what the ventilation readings are judged against. */
  room: z
    .object({
      volumeM3: z.number().nullable(),
      constructionClass: z.enum(["new_or_renovated", "existing"]).nullable(),
      minimumAirChanges: z.number().nullable(),
    })
    .nullable(),
});
export type AuditDetail = z.infer<typeof auditDetailSchema>;

export const auditListResponseSchema = z.object({ audits: z.array(auditSchema) });

export const scheduleEntrySchema = z.object({
  spaceId: uuidSchema,
  spaceName: responseText(),
  zoneType: z.enum(zoneTypes),
  floorId: uuidSchema,
  floorName: responseText(),
  cadenceDays: z.number().int(),
  lastAuditAt: responseText().nullable(),
  dueAt: responseText(),
  state: z.enum(["overdue", "due_soon", "ok"]),
  verdict: z.enum(verdicts).nullable(),
  lastAuditorName: responseText().nullable(),
});
export type ScheduleEntry = z.infer<typeof scheduleEntrySchema>;
export const scheduleResponseSchema = z.object({ entries: z.array(scheduleEntrySchema) });

/** What one auditor has due across every site where they audit. */
export const myDueEntrySchema = scheduleEntrySchema.extend({
  siteId: uuidSchema,
  siteName: responseText(),
});
export type MyDueEntry = z.infer<typeof myDueEntrySchema>;
export const myDueResponseSchema = z.object({ entries: z.array(myDueEntrySchema) });

export const cadenceBodySchema = z.strictObject({
  cadenceDays: numberInput()
    .int({ message: "A whole number of days." })
    .min(1, { message: "At least 1 day." })
    .max(366, { message: "At most 366 days." }),
});

/** A logged correction of a submitted audit by an administrator; the verdict is decided again. */
export const amendmentBodySchema = z.strictObject({
  itemId: uuidSchema,
  outcome: z.enum(outcomes, { message: "Choose pass, fail or not applicable." }),
  note: text().trim().max(2000, { message: "At most 2000 characters." }).nullable().optional(),
  reason: text()
    .trim()
    .min(5, { message: "Say why, in a few words." })
    .max(500, { message: "At most 500 characters." }),
});
export type AmendmentBody = z.infer<typeof amendmentBodySchema>;
