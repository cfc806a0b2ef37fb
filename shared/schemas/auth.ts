import { z } from "zod";

import { roles } from "../roles";
import { emailSchema, text, uuidSchema, responseText } from "./common";

export const signInBodySchema = z.strictObject({
  email: emailSchema,
  password: text()
    .min(1, { message: "Required." })
    .max(256, { message: "At most 256 characters." }),
});
export type SignInBody = z.infer<typeof signInBodySchema>;

export const roleGrantSchema = z.object({
  role: z.enum(roles),
  siteId: uuidSchema.nullable(),
});

export const meResponseSchema = z.object({
  user: z.object({ id: uuidSchema, email: responseText(), name: responseText() }),
  roles: z.array(roleGrantSchema),
});
export type MeResponse = z.infer<typeof meResponseSchema>;
