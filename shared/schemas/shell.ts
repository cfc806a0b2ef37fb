import { z } from "zod/mini";

import { roles } from "../roles";

/**
 * The replies the app shell reads before any page can show (who is signed in, how this
 * installation runs, the error envelope), written with the small build of zod so the first file a
 * phone downloads does not carry the whole validation library. Every other schema loads with the
 * page that uses it.
 */

/** The one error envelope: `{ error: { code, message, fields? } }`. */
export const apiErrorEnvelopeSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    /** Field name (dot-separated inside nested input, e.g. `email`, `grants.0.siteId`) → message. */
    fields: z.optional(z.record(z.string(), z.string())),
  }),
});
export type ApiErrorEnvelope = z.infer<typeof apiErrorEnvelopeSchema>;

export const roleGrantSchema = z.object({
  role: z.enum(roles),
  siteId: z.nullable(z.uuid()),
});

export const meResponseSchema = z.object({
  user: z.object({ id: z.uuid(), email: z.string(), name: z.string() }),
  roles: z.array(roleGrantSchema),
});
export type MeResponse = z.infer<typeof meResponseSchema>;

export const appConfigSchema = z.object({
  /** The local mail catcher runs beside this app, so administrators can read its inbox. */
  demoMailbox: z.boolean(),
});
export type AppConfig = z.infer<typeof appConfigSchema>;
