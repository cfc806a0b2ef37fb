import { z } from "zod";

import { responseText, uuidSchema } from "./common";

export const mailParamsSchema = z.strictObject({ mailId: uuidSchema });

/**
 * An e-mail that may not have reached its recipient: `uncertain` when the sending process stopped
 * mid-send (it may or may not have arrived), `failed` when the SMTP server refused it to the last
 * attempt. Bodies stay on the server: they may carry one-time links.
 */
export const undeliveredMailSchema = z.object({
  id: responseText(),
  /** What the e-mail was about, e.g. `invitation`, `action_assigned`. */
  topic: responseText(),
  recipient: responseText(),
  recipientName: responseText(),
  subject: responseText(),
  status: z.enum(["uncertain", "failed"]),
  attempts: z.number().int(),
  queuedAt: responseText(),
  lastTriedAt: responseText().nullable(),
  problem: responseText().nullable(),
});
export type UndeliveredMail = z.infer<typeof undeliveredMailSchema>;

export const undeliveredMailListSchema = z.object({ mail: z.array(undeliveredMailSchema) });

export const resendResultSchema = z.object({
  id: responseText(),
  /** Where the e-mail stands now: `pending` until the worker sends it. */
  status: z.enum(["pending", "sending", "sent", "failed", "uncertain"]),
  /** False when it had already been sent again (a second click): nothing more was queued. */
  resent: z.boolean(),
});
export type ResendResult = z.infer<typeof resendResultSchema>;
