import { z } from "zod";

import { emailSchema, text } from "./common";

export const signInBodySchema = z.strictObject({
  email: emailSchema,
  password: text()
    .min(1, { message: "Required." })
    .max(256, { message: "At most 256 characters." }),
});
export type SignInBody = z.infer<typeof signInBodySchema>;

// Read by the app shell before any page shows: kept in the small schemas the shell loads.
export { meResponseSchema, roleGrantSchema, type MeResponse } from "./shell";
