import { z } from "zod";

import { quantities } from "../calc/answer-rules";
import { severities } from "../calc/verdict";
import { zoneTypes } from "../zones";
import { numberInput, requiredText, text, uuidSchema, responseText } from "./common";

export const responseKinds = ["check", "reading", "count", "choice"] as const;
export { quantities } from "../calc/answer-rules";

export const thresholdSchema = z.strictObject({
  op: z.enum([">=", "<="], { message: "Choose at least or at most." }),
  value: numberInput().refine(Number.isFinite, { message: "Must be a number." }),
});

export const choiceSchema = z.strictObject({
  value: requiredText(40),
  label: requiredText(80),
  passes: z.boolean({ message: "Say whether this choice passes." }),
});

export const checklistItemSchema = z.object({
  id: uuidSchema,
  key: responseText(),
  position: z.number().int(),
  text: responseText(),
  severity: z.enum(severities),
  response: z.enum(responseKinds),
  quantity: z.enum(quantities).nullable(),
  threshold: thresholdSchema.nullable(),
  choices: z.array(choiceSchema).nullable(),
  reference: responseText().nullable(),
  photoOnFail: z.boolean(),
});
export type ChecklistItem = z.infer<typeof checklistItemSchema>;

export const checklistVersionSchema = z.object({
  id: uuidSchema,
  zoneType: z.enum(zoneTypes),
  version: z.number().int(),
  status: z.enum(["draft", "published"]),
  title: responseText(),
  publishedAt: responseText().nullable(),
  items: z.array(checklistItemSchema),
});
export type ChecklistVersion = z.infer<typeof checklistVersionSchema>;

export const checklistsResponseSchema = z.object({
  checklists: z.array(
    z.object({
      zoneType: z.enum(zoneTypes),
      published: checklistVersionSchema,
      draft: checklistVersionSchema.nullable(),
      /** Set while the draft holds a newer revision of Lintel's defaults offered to the network. */
      defaultUpdate: z.object({ revision: z.number().int() }).nullable(),
    }),
  ),
});
export type ChecklistsResponse = z.infer<typeof checklistsResponseSchema>;

/** One item of a draft; omit `key` for a new item, keep it when rewording an existing one. */
export const draftItemSchema = z
  .strictObject({
    key: text().trim().min(1).max(60, { message: "At most 60 characters." }).optional(),
    text: requiredText(300),
    severity: z.enum(severities, { message: "Choose a severity." }),
    response: z.enum(responseKinds, { message: "Choose how it is answered." }),
    quantity: z.enum(quantities).nullable().optional(),
    threshold: thresholdSchema.nullable().optional(),
    choices: z
      .array(choiceSchema)
      .min(2, { message: "At least two choices." })
      .max(8)
      .nullable()
      .optional(),
    reference: text().trim().max(300, { message: "At most 300 characters." }).nullable().optional(),
    photoOnFail: z.boolean().default(false),
  })
  .refine((item) => item.response !== "reading" || Boolean(item.quantity), {
    message: "A reading needs a quantity.",
    path: ["quantity"],
  })
  .refine((item) => item.response !== "choice" || (item.choices?.length ?? 0) >= 2, {
    message: "A choice needs at least two options.",
    path: ["choices"],
  });

export const checklistDraftBodySchema = z.strictObject({
  title: requiredText(120),
  items: z
    .array(draftItemSchema)
    .min(1, { message: "Keep at least one item." })
    .max(80, { message: "At most 80 items." }),
});
export type ChecklistDraftBody = z.infer<typeof checklistDraftBodySchema>;

export const zoneTypeParamsSchema = z.strictObject({
  zoneType: z.enum(zoneTypes, { message: "Choose a zone type." }),
});
