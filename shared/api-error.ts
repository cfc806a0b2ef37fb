import { z } from "zod";

/** Error codes every API error carries. Clients branch on the code, never on the message. */
export const apiErrorCodes = [
  "bad_request",
  "validation_failed",
  "unauthenticated",
  "invalid_credentials",
  "forbidden",
  "bad_origin",
  "not_found",
  "conflict",
  "link_invalid",
  "payload_too_large",
  "unsupported_media_type",
  "rate_limited",
  "unavailable",
  "internal",
] as const;
export type ApiErrorCode = (typeof apiErrorCodes)[number];

/** The one error envelope: `{ error: { code, message, fields? } }`. */
export const apiErrorEnvelopeSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    /** Field name (dot-separated inside nested input, e.g. `email`, `grants.0.siteId`) → message. */
    fields: z.record(z.string(), z.string()).optional(),
  }),
});
export type ApiErrorEnvelope = z.infer<typeof apiErrorEnvelopeSchema>;
