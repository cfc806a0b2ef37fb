import { z } from "zod";

import { requiredText, responseText, text, uuidSchema } from "./common";
import { maxBatchReadings } from "./pressure-readings";

/**
 * Upload tokens (one site's key for sending readings over HTTP) and the upload's answer. The
 * readings themselves follow `pressure-readings.ts`.
 */

export const uploadTokenParamsSchema = z.strictObject({ siteId: uuidSchema });
export const uploadTokenItemParamsSchema = z.strictObject({
  siteId: uuidSchema,
  tokenId: uuidSchema,
});

export const createUploadTokenBodySchema = z.strictObject({
  /** What sends with it, e.g. "Building 2 gateway", so a person knows which to revoke. */
  name: requiredText(80),
});
export type CreateUploadTokenBody = z.infer<typeof createUploadTokenBodySchema>;

export const uploadTokenSchema = z.object({
  id: responseText(),
  name: responseText(),
  createdAt: responseText(),
  createdByName: responseText().nullable(),
  lastUsedAt: responseText().nullable(),
  revokedAt: responseText().nullable(),
});
export type UploadToken = z.infer<typeof uploadTokenSchema>;

export const uploadTokenListSchema = z.object({ tokens: z.array(uploadTokenSchema) });
export type UploadTokenList = z.infer<typeof uploadTokenListSchema>;

/** The reply to making a token: the token itself, shown this once and never again. */
export const createdUploadTokenSchema = z.object({
  token: uploadTokenSchema,
  secret: responseText(),
});
export type CreatedUploadToken = z.infer<typeof createdUploadTokenSchema>;

/** Tokens look like this, so a person (or a secret scanner) can tell one at a glance. */
export const uploadTokenPrefix = "lintel_pu_";

/**
 * The request body as the route sees it: JSON `{ "readings": [...] }` (each reading checked on
 * its own, so one bad row does not refuse the rest), or a CSV file (`Content-Type: text/csv`),
 * which arrives here as `{ "csv": "..." }`.
 */
export const pressureUploadBodySchema = z
  .strictObject({
    readings: z
      .array(z.unknown(), { error: "Send a list of readings." })
      .min(1, { message: "Send at least one reading." })
      .max(maxBatchReadings, {
        message: `At most ${maxBatchReadings.toLocaleString("en-US")} readings in one upload.`,
      })
      .optional(),
    csv: text().optional(),
  })
  .superRefine((body, ctx) => {
    if (body.readings === undefined && body.csv === undefined)
      ctx.addIssue({
        code: "custom",
        path: ["readings"],
        message: 'Send { "readings": [ … ] } as JSON, or a CSV file as text/csv.',
      });
    if (body.readings !== undefined && body.csv !== undefined)
      ctx.addIssue({ code: "custom", path: ["csv"], message: "Send readings or a CSV, not both." });
  });

export const refusalReasons = ["invalid", "future", "wrong_site"] as const;

/** One refused reading: where it was (JSON index or CSV line), the field at fault and why. */
export const refusedReadingSchema = z.object({
  /** The reading's place in `readings` (JSON). */
  index: z.number().optional(),
  /** The CSV line (1 = the header). */
  line: z.number().optional(),
  /** `readings.3.pressure` for JSON; the column, `pressure`, for CSV. */
  field: responseText(),
  message: responseText(),
  reason: z.enum(refusalReasons),
});
export type RefusedReading = z.infer<typeof refusedReadingSchema>;

export const pressureUploadResultSchema = z.object({
  received: z.number(),
  stored: z.number(),
  /** Already stored (an upload sent again) or repeated in this upload: kept once. */
  duplicates: z.number(),
  refused: z.array(refusedReadingSchema),
});
export type PressureUploadResult = z.infer<typeof pressureUploadResultSchema>;
