import type { QueryClient } from "@tanstack/react-query";

import { signOut } from "@/features/auth/api/sign-out";
import type { UnsentWork } from "@/features/walkthroughs/lib/offline-store";
import { isApiError } from "@/lib/api-client";
import { deleteKept, hasKeptStorage } from "@/lib/kept-store";
import { queryKeys } from "@/lib/query-keys";
import { forgetPhonePerson, phonePersonId, setSignOutPending } from "@/lib/phone-person";

import { forgetRestored } from "./kept-data";

const walkthroughs = () => import("@/features/walkthroughs/lib/audit-device");

/** What the person leaves unsent on this phone; nothing when the browser keeps no store. */
export async function unsentWorkOnPhone(): Promise<UnsentWork> {
  const module = await walkthroughs();
  if (!module.hasOfflineStorage() || !phonePersonId())
    return { audits: 0, observations: 0, changes: 0 };
  const { store } = await module.auditDevice();
  return store.unsentWork();
}

export type UnsentChoice = "keep" | "discard";

export interface SignedOut {
  /** False when Lintel could not be reached: the session there ends at the next connection. */
  reachedLintel: boolean;
  /** The identity provider's page that ends its session too, when the session began there. */
  providerSignOutUrl: string | null;
}

/**
 * Signs the person out of this phone. Their queue stops first, so nothing more is sent under their
 * session; it stays in their own store ("keep", sent when they next sign in here) or is deleted
 * ("discard"). What was kept for them to work offline is deleted either way. With no signal the
 * phone still signs out, and ends the server session as soon as it can.
 */
export async function signOutOfPhone(
  queryClient: QueryClient,
  choice: UnsentChoice,
): Promise<SignedOut> {
  const personId = phonePersonId();
  const module = await walkthroughs();
  await module.closeAuditDevice();

  let reachedLintel = true;
  let providerSignOutUrl: string | null = null;
  try {
    ({ providerSignOutUrl } = await signOut());
    setSignOutPending(false);
  } catch (error) {
    // The session is already over (401): as good as signed out. Otherwise try again later.
    if (!(isApiError(error) && error.status === 401)) {
      reachedLintel = false;
      setSignOutPending(true);
    }
  }

  if (personId) {
    if (choice === "discard" && module.hasOfflineStorage()) {
      await module.discardAuditStore(personId);
    }
    if (hasKeptStorage()) await deleteKept(personId).catch(() => undefined);
    forgetRestored(personId);
  }
  forgetPhonePerson();
  queryClient.setQueryData(queryKeys.sessions.me, null);
  queryClient.removeQueries({
    predicate: (query) => query.queryKey[0] !== queryKeys.sessions.me[0],
  });
  return { reachedLintel, providerSignOutUrl };
}
