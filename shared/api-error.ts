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

// The one error envelope, `{ error: { code, message, fields? } }`: the app shell reads it on every
// failed request, so it lives with the shell's small schemas.
export { apiErrorEnvelopeSchema, type ApiErrorEnvelope } from "./schemas/shell";
