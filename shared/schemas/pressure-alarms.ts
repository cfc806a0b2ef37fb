import { z } from "zod";

import { numberInput, responseText, uuidSchema } from "./common";

/**
 * A site's room-pressure alarm settings. A number left null is Lintel's default (60 s grace,
 * 5 min door grace, 15 min action limit: shared/calc/pressure-excursions.ts); `recipients`
 * "default" means the site's facilities leads and auditors.
 */
export const pressureSettingsLimits = {
  graceSeconds: { min: 0, max: 3600 },
  doorGraceSeconds: { min: 0, max: 3600 },
  actionLimitMinutes: { min: 1, max: 1440 },
} as const;

const wholeNumber = (min: number, max: number) =>
  numberInput().int({ message: "Must be a whole number." }).min(min).max(max).nullable();

const recipientIds = z.array(uuidSchema).max(200);
const chooseWords =
  'Choose people of this site, or "default" for its facilities leads and auditors.';

/** "default", or a list of people's ids; a wrong id is named by its place (recipients.2). */
const recipientsSchema = z.unknown().transform((value, ctx): "default" | string[] => {
  if (value === "default") return "default";
  if (Array.isArray(value)) {
    const parsed = recipientIds.safeParse(value);
    if (parsed.success) return parsed.data;
    for (const issue of parsed.error.issues)
      ctx.addIssue({ code: "custom", message: issue.message, path: issue.path });
    return z.NEVER;
  }
  ctx.addIssue({ code: "custom", message: value === undefined ? "Required." : chooseWords });
  return z.NEVER;
});

export const pressureSettingsBodySchema = z
  .strictObject({
    graceSeconds: wholeNumber(
      pressureSettingsLimits.graceSeconds.min,
      pressureSettingsLimits.graceSeconds.max,
    ),
    doorGraceSeconds: wholeNumber(
      pressureSettingsLimits.doorGraceSeconds.min,
      pressureSettingsLimits.doorGraceSeconds.max,
    ),
    actionLimitMinutes: wholeNumber(
      pressureSettingsLimits.actionLimitMinutes.min,
      pressureSettingsLimits.actionLimitMinutes.max,
    ),
    recipients: recipientsSchema,
  })
  .superRefine((body, ctx) => {
    const grace = body.graceSeconds ?? 60;
    const doorGrace = body.doorGraceSeconds ?? 300;
    if (doorGrace < grace)
      ctx.addIssue({
        code: "custom",
        path: ["doorGraceSeconds"],
        message: "The door grace cannot be shorter than the grace.",
      });
    if (Array.isArray(body.recipients) && new Set(body.recipients).size !== body.recipients.length)
      ctx.addIssue({ code: "custom", path: ["recipients"], message: "A person is listed twice." });
  });
export type PressureSettingsBody = z.infer<typeof pressureSettingsBodySchema>;

export const pressureSettingsResponseSchema = z.object({
  graceSeconds: z.number().nullable(),
  doorGraceSeconds: z.number().nullable(),
  actionLimitMinutes: z.number().nullable(),
  /** What applies now, defaults filled in. */
  effective: z.object({
    graceSeconds: z.number(),
    doorGraceSeconds: z.number(),
    actionLimitMinutes: z.number(),
  }),
  recipients: z.union([z.literal("default"), z.array(responseText())]),
  /** Who is told now: the chosen people, or the site's facilities leads and auditors. */
  notified: z.array(z.object({ id: responseText(), name: responseText() })),
  /** People with a role at the site, who may be chosen. */
  people: z.array(
    z.object({ id: responseText(), name: responseText(), roles: z.array(responseText()) }),
  ),
});
export type PressureSettingsResponse = z.infer<typeof pressureSettingsResponseSchema>;
