import { z } from "zod";

import { networkWideRoles, roles } from "../roles";
import { emailSchema, requiredText, text, uuidSchema, responseText } from "./common";

/** NIST SP 800-63B style: length, no composition rules; the server also refuses common passwords. */
export const passwordMinLength = 12;
export const passwordSchema = text()
  .min(passwordMinLength, { message: `At least ${passwordMinLength} characters.` })
  .max(128, { message: "At most 128 characters." });

export const grantInputSchema = z
  .strictObject({
    role: z.enum(roles, { message: "Choose a role." }),
    siteId: uuidSchema.nullable(),
  })
  .refine((grant) => grant.siteId !== null || networkWideRoles.includes(grant.role), {
    message: "Choose a site for this role.",
    path: ["siteId"],
  });
export type GrantInput = z.infer<typeof grantInputSchema>;

export const inviteBodySchema = z.strictObject({
  email: emailSchema,
  name: requiredText(120),
  grants: z
    .array(grantInputSchema, { message: "Give at least one role." })
    .min(1, { message: "Give at least one role." })
    .max(30, { message: "At most 30 roles." }),
});
export type InviteBody = z.infer<typeof inviteBodySchema>;

export const personStatuses = ["active", "invited", "deactivated"] as const;
export type PersonStatus = (typeof personStatuses)[number];

export const personGrantSchema = z.object({
  id: uuidSchema,
  role: z.enum(roles),
  siteId: uuidSchema.nullable(),
  /** null for network-wide grants. */
  siteName: responseText().nullable(),
});

export const personSchema = z.object({
  id: uuidSchema,
  email: responseText(),
  name: responseText(),
  status: z.enum(personStatuses),
  grants: z.array(personGrantSchema),
  createdAt: responseText(),
  deactivatedAt: responseText().nullable(),
  /** When the newest unused invitation link stops working; null when none is pending. */
  invitationExpiresAt: responseText().nullable(),
});
export type Person = z.infer<typeof personSchema>;

export const peopleListResponseSchema = z.object({
  people: z.array(personSchema),
  /** Sites where the caller may manage people (for the role pickers). */
  manageableSites: z.array(z.object({ id: uuidSchema, name: responseText() })),
  /** Whether the caller may give network-wide roles. */
  canGrantNetworkWide: z.boolean(),
});
export type PeopleListResponse = z.infer<typeof peopleListResponseSchema>;

export const personResponseSchema = z.object({ person: personSchema });
export type PersonResponse = z.infer<typeof personResponseSchema>;

export const personParamsSchema = z.strictObject({ userId: uuidSchema });
export const personGrantParamsSchema = z.strictObject({ userId: uuidSchema, grantId: uuidSchema });

export const deactivateBodySchema = z.strictObject({
  reason: text().trim().max(500, { message: "At most 500 characters." }).optional(),
});
export const emptyBodySchema = z.strictObject({}).optional();

/** Tokens in e-mailed links: 43 base64url characters (32 random bytes). */
export const linkTokenParamsSchema = z.strictObject({
  token: text().regex(/^[A-Za-z0-9_-]{43}$/, {
    message: "This link is not complete. Open it from the e-mail again.",
  }),
});

export const invitationInfoSchema = z.object({
  email: responseText(),
  name: responseText(),
  expiresAt: responseText(),
});
export type InvitationInfo = z.infer<typeof invitationInfoSchema>;

export const setPasswordBodySchema = z.strictObject({ password: passwordSchema });
export type SetPasswordBody = z.infer<typeof setPasswordBodySchema>;

export const passwordResetRequestSchema = z.strictObject({ email: emailSchema });
export type PasswordResetRequest = z.infer<typeof passwordResetRequestSchema>;

export const passwordResetInfoSchema = z.object({
  email: responseText(),
  expiresAt: responseText(),
});

export const updateProfileBodySchema = z.strictObject({ name: requiredText(120) });
export type UpdateProfileBody = z.infer<typeof updateProfileBodySchema>;

export const changePasswordBodySchema = z.strictObject({
  currentPassword: text()
    .min(1, { message: "Required." })
    .max(256, { message: "At most 256 characters." }),
  newPassword: passwordSchema,
});
export type ChangePasswordBody = z.infer<typeof changePasswordBodySchema>;

// Read by the app shell before any page shows: kept in the small schemas the shell loads.
export { appConfigSchema, type AppConfig } from "./shell";

export const mailboxMessageSchema = z.object({
  id: responseText(),
  to: z.array(responseText()),
  from: responseText(),
  subject: responseText(),
  text: responseText(),
  html: responseText().nullable(),
  receivedAt: responseText(),
});
export type MailboxMessage = z.infer<typeof mailboxMessageSchema>;
export const mailboxResponseSchema = z.object({ messages: z.array(mailboxMessageSchema) });
