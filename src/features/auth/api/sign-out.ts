import { apiRequest } from "@/lib/api-client";

/**
 * Ends the session on the server. Signing out of the phone (its stores, the person it keeps) is
 * composed around this by the app, which knows the audit queue.
 */
export function signOut(): Promise<undefined> {
  return apiRequest("/api/auth/sign-out", { method: "POST" });
}
