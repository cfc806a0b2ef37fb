import type { SignOutResponse } from "@shared/schemas/identity-provider";
import { z } from "zod";

import { fetchFromApi, readApiError } from "@/lib/api-client";

/**
 * The contract's `signOutResponseSchema`, written here: the contract's module would be one more
 * file for the account page, which a phone also fetches ahead to work offline.
 */
const signOutReplySchema = z.object({
  providerSignOutUrl: z.string().nullable(),
}) satisfies z.ZodType<SignOutResponse>;

export interface SignOutAnswer {
  /** Where to end the provider's session too (RP-initiated logout); null for a password session. */
  providerSignOutUrl: string | null;
}

/** Only a web address is followed, never a script or data URL, whatever the reply said. */
function webAddress(value: string | null): string | null {
  if (!value) return null;
  try {
    const url = new URL(value);
    return url.protocol === "https:" || url.protocol === "http:" ? url.href : null;
  } catch {
    return null;
  }
}

/**
 * Ends the session on the server: 204 for a password session, 200 with the provider's sign-out
 * address for a session begun through a provider that offers one. Signing out of the phone (its
 * stores, the person it keeps) is composed around this by the app, which knows the audit queue.
 */
export async function signOut(): Promise<SignOutAnswer> {
  const response = await fetchFromApi("/api/auth/sign-out", {
    method: "POST",
    headers: { Accept: "application/json" },
  });
  if (!response.ok) throw await readApiError(response);
  if (response.status === 204) return { providerSignOutUrl: null };
  // Lintel's session has ended either way: an unreadable reply only loses the provider's step.
  const body: unknown = await response.json().catch(() => undefined);
  const parsed = signOutReplySchema.safeParse(body);
  return { providerSignOutUrl: parsed.success ? webAddress(parsed.data.providerSignOutUrl) : null };
}
