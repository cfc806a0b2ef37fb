import { z } from "zod";

import { emailSchema, requiredText, responseText, text } from "./common";

/**
 * Sign-in through the network's own identity provider (OpenID Connect). One provider per network;
 * it covers the e-mail domains its administrator lists, and a domain belongs to one network at most.
 */

/** A domain as people type it: lower-cased, no "@", at least one dot. */
export const emailDomainSchema = text()
  .trim()
  .toLowerCase()
  .max(253, { message: "At most 253 characters." })
  .regex(/^(?=.{1,253}$)(?:[a-z0-9](?:[a-z0-9-]{0,61}[a-z0-9])?\.)+[a-z]{2,63}$/, {
    message: "Enter a domain such as example.org, without the @.",
  });

// ---- The sign-in page: e-mail first -------------------------------------------------------------

/** `POST /api/auth/sign-in/method` (public): how this address signs in. */
export const signInMethodBodySchema = z.strictObject({ email: emailSchema });
export type SignInMethodBody = z.infer<typeof signInMethodBodySchema>;

/**
 * Decided by the address's domain alone, never by whether the person exists (no account
 * discovery); an address no provider covers gets `{ password: true, provider: null }`.
 * `provider.startUrl` is a same-origin path (`/api/auth/provider/start?...`) the browser navigates to.
 */
export const signInMethodResponseSchema = z.object({
  password: z.boolean(),
  provider: z
    .object({
      /** What the button says after "Sign in with": the name the administrator gave it. */
      name: responseText(),
      startUrl: responseText(),
    })
    .nullable(),
});
export type SignInMethodResponse = z.infer<typeof signInMethodResponseSchema>;

/**
 * Why a provider sign-in ended without a session. The server redirects the browser to
 * `/sign-in/problem?reason=<reason>&request=<request id>`, and the page explains each in words.
 */
export const providerProblemReasons = [
  "state", // the answer does not belong to a sign-in this browser started (or it was used already)
  "code", // the provider refused the code (replayed, expired)
  "token", // the ID token failed a check: issuer, audience, expiry, signature, nonce
  "unverified", // the provider did not say the e-mail address is verified
  "unknown", // the network does not know this person: ask the administrator for an invitation
  "deactivated", // the account is deactivated
  "unavailable", // the provider could not be reached or answered with an error
  "cancelled", // the person cancelled at the provider
] as const;
export const providerProblemReasonSchema = z.enum(providerProblemReasons);
export type ProviderProblemReason = z.infer<typeof providerProblemReasonSchema>;

/**
 * `POST /api/auth/sign-out` answers 204 for a password session (as before) and 200 with this body
 * for a session begun through a provider that offers end-session: the client then navigates there,
 * and the provider sends the browser back to `/sign-in`.
 */
export const signOutResponseSchema = z.object({ providerSignOutUrl: responseText().nullable() });
export type SignOutResponse = z.infer<typeof signOutResponseSchema>;

// ---- Administration (network-wide administrator) ------------------------------------------------

/**
 * `GET /api/admin/identity-provider` → `{ provider: IdentityProviderSettings | null }`.
 * The client secret is never sent back: only whether one is stored.
 */
export const identityProviderSettingsSchema = z.object({
  id: z.uuid(),
  name: responseText(),
  issuerUrl: responseText(),
  clientId: responseText(),
  clientSecretStored: z.boolean(),
  domains: z.array(responseText()),
  passwordAllowed: z.boolean(),
  /** The administrator declared that the provider only issues verified addresses (logged, shown). */
  assumeVerifiedEmail: z.boolean(),
  /** What to register at the provider. */
  redirectUri: responseText(),
  postLogoutRedirectUri: responseText(),
  updatedAt: responseText(),
});
export type IdentityProviderSettings = z.infer<typeof identityProviderSettingsSchema>;
export const identityProviderResponseSchema = z.object({
  provider: identityProviderSettingsSchema.nullable(),
  /** Shown before any provider exists, so the administrator can register Lintel first. */
  redirectUri: responseText(),
  postLogoutRedirectUri: responseText(),
});
export type IdentityProviderResponse = z.infer<typeof identityProviderResponseSchema>;

/**
 * `PUT /api/admin/identity-provider` → `{ provider: IdentityProviderSettings }` (200).
 * `clientSecret` is required when no secret is stored yet; left out (or empty) it keeps the stored one.
 * 422 with the field named for: an issuer that is not https (http only on loopback), an issuer on a
 * private or link-local address, a domain another network's provider already covers.
 */
export const identityProviderBodySchema = z.strictObject({
  name: requiredText(80),
  issuerUrl: requiredText(500),
  clientId: requiredText(200),
  clientSecret: text().max(500, { message: "At most 500 characters." }).optional(),
  domains: z
    .array(emailDomainSchema)
    .min(1, { message: "List at least one e-mail domain." })
    .max(20, { message: "At most 20 domains." }),
  passwordAllowed: z.boolean(),
  assumeVerifiedEmail: z.boolean(),
});
export type IdentityProviderBody = z.infer<typeof identityProviderBodySchema>;

/** `DELETE /api/admin/identity-provider` → 204: provider sign-in ends, password sign-in returns. */

/**
 * `POST /api/admin/identity-provider/test` (no body: tests the stored settings) → this.
 * Steps in order; a failed step stops the ones after it (they come back with `ok: null`).
 * `words` are Lintel's own sentences: nothing the provider answered is echoed back.
 */
export const connectionTestStepSchema = z.object({
  step: z.enum(["address", "discovery", "client"]),
  ok: z.boolean().nullable(),
  words: responseText(),
});
export const connectionTestResponseSchema = z.object({
  ok: z.boolean(),
  steps: z.array(connectionTestStepSchema),
});
export type ConnectionTestResponse = z.infer<typeof connectionTestResponseSchema>;
