import { z } from "zod";

import { dueUnits, maxDueAmount } from "../calc/due";
import { severities } from "../calc/verdict";
import { zoneTypes } from "../zones";
import { numberInput, text, uuidSchema, responseText } from "./common";

/** open → in progress → awaiting verification → closed; rejected or reopened go back to in progress. */
export const actionStatuses = ["open", "in_progress", "awaiting_verification", "closed"] as const;
export type ActionStatus = (typeof actionStatuses)[number];

export const actionStatusLabels: Record<ActionStatus, string> = {
  open: "To fix",
  in_progress: "Being fixed",
  awaiting_verification: "Fix to check",
  closed: "Done",
};

export const actionParamsSchema = z.strictObject({ actionId: uuidSchema });

/** The text fields beside a proof photo: the id the phone made, reused when it sends again. */
export const proofFieldsSchema = z.strictObject({ id: uuidSchema });

const boolFlag = z.enum(["true", "false"], { message: "Use true or false." });

/** Filters of a site's list; the map asks for the open ones on one floor. */
export const actionListQuerySchema = z.strictObject({
  state: z
    .enum(["open", "closed", "all"], { message: "Use open, closed or all." })
    .optional()
    .default("all"),
  floorId: uuidSchema.optional(),
  spaceId: uuidSchema.optional(),
  severity: z.enum(severities, { message: "Use critical, major or minor." }).optional(),
  overdue: boolFlag.optional(),
});
export type ActionListQuery = z.infer<typeof actionListQuerySchema>;

export const personRefSchema = z.object({ id: uuidSchema, name: responseText() });

export const actionCloseReasons = ["verified", "space_retired"] as const;
export type ActionCloseReason = (typeof actionCloseReasons)[number];

export const actionSummarySchema = z.object({
  id: uuidSchema,
  siteId: uuidSchema,
  siteName: responseText(),
  siteTimeZone: responseText(),
  spaceId: uuidSchema,
  spaceName: responseText(),
  zoneType: z.enum(zoneTypes),
  floorId: uuidSchema,
  floorName: responseText(),
  itemKey: responseText(),
  title: responseText(),
  severity: z.enum(severities),
  status: z.enum(actionStatuses),
  assignee: personRefSchema.nullable(),
  openedAt: responseText(),
  dueAt: responseText(),
  closedAt: responseText().nullable(),
  /** Elapsed days from opening to the latest close; none when it closed without a fix. */
  daysToClose: z.number().nullable(),
  /** Why it closed: an auditor saw the fix, or its space was retired. Null while not closed. */
  closeReason: z.enum(actionCloseReasons).nullable(),
  /** When the action's space was retired (it is then hidden from the map and new audits). */
  spaceRetiredAt: responseText().nullable(),
  overdue: z.boolean(),
  findingCount: z.number().int(),
  /** Where the pin goes, in plan units of the floor. */
  position: z.object({ x: z.number(), y: z.number() }),
});
export type ActionSummary = z.infer<typeof actionSummarySchema>;

export const actionListResponseSchema = z.object({ actions: z.array(actionSummarySchema) });

export const findingSchema = z.object({
  id: uuidSchema,
  auditId: uuidSchema,
  auditedAt: responseText(),
  auditorName: responseText(),
  itemText: responseText(),
  severity: z.enum(severities),
  note: responseText().nullable(),
  photos: z.array(z.object({ imageId: uuidSchema })),
});
export type Finding = z.infer<typeof findingSchema>;

export const proofSchema = z.object({
  id: uuidSchema,
  imageId: uuidSchema,
  uploadedBy: responseText().nullable(),
  createdAt: responseText(),
  /** Proof of the current attempt counts towards sending for verification; older proof stays. */
  current: z.boolean(),
});
export type Proof = z.infer<typeof proofSchema>;

export const timelineKinds = [
  "opened",
  "finding_added",
  "assigned",
  "started",
  "proof_added",
  "sent_for_verification",
  "verified",
  "rejected",
  "reopened",
  "space_retired",
  "space_restored",
] as const;
export type TimelineKind = (typeof timelineKinds)[number];

export const timelineEntrySchema = z.object({
  id: uuidSchema,
  at: responseText(),
  kind: z.enum(timelineKinds),
  actorName: responseText().nullable(),
  fromStatus: z.enum(actionStatuses).nullable(),
  toStatus: z.enum(actionStatuses).nullable(),
  /** The note or reason given with the move. */
  text: responseText().nullable(),
});
export type TimelineEntry = z.infer<typeof timelineEntrySchema>;

export const actionDetailSchema = z.object({
  action: actionSummarySchema,
  findings: z.array(findingSchema),
  proofs: z.array(proofSchema),
  timeline: z.array(timelineEntrySchema),
  plan: z
    .object({
      imageId: uuidSchema,
      width: z.number(),
      height: z.number(),
      spacePolygon: z.array(z.tuple([z.number(), z.number()])),
    })
    .nullable(),
});
export type ActionDetail = z.infer<typeof actionDetailSchema>;

const longText = (min: number, tooShort: string) =>
  text().trim().min(min, { message: tooShort }).max(2000, { message: "At most 2000 characters." });

/** Sending for verification and verifying both need a note of what was done or seen. */
export const actionNoteBodySchema = z.strictObject({
  note: longText(3, "Say what was done or seen, in a few words."),
});
export type ActionNoteBody = z.infer<typeof actionNoteBodySchema>;

/** Rejecting proof and reopening a closed action both need a reason. */
export const actionReasonBodySchema = z.strictObject({
  reason: longText(5, "Say why, in a few words."),
});
export type ActionReasonBody = z.infer<typeof actionReasonBodySchema>;

export const assigneeBodySchema = z.strictObject({ assigneeId: uuidSchema });

export const assigneeListResponseSchema = z.object({ people: z.array(personRefSchema) });

const dueRuleSchema = z
  .strictObject({
    amount: numberInput().int({ message: "A whole number." }),
    unit: z.enum(dueUnits, { message: "Use hours or days." }),
  })
  .superRefine((rule, ctx) => {
    const max = maxDueAmount[rule.unit];
    if (rule.amount < 1 || rule.amount > max) {
      ctx.addIssue({
        code: "custom",
        path: ["amount"],
        message: `Between 1 and ${max} ${rule.unit}.`,
      });
    }
  });

export const duePolicySchema = z.strictObject({
  critical: dueRuleSchema,
  major: dueRuleSchema,
  minor: dueRuleSchema,
});

export const duePolicyResponseSchema = z.object({
  policy: duePolicySchema,
  /** True while the site uses the defaults (common practice: 24 hours, 7 days, 30 days). */
  isDefault: z.boolean(),
});
export type DuePolicyResponse = z.infer<typeof duePolicyResponseSchema>;
