import { type MeResponse, meResponseSchema } from "@shared/schemas/shell";
import { type QueryClient, queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest, isApiError } from "@/lib/api-client";
import { rememberPhonePerson, setSignOutPending, signOutPending } from "@/lib/phone-person";
import { queryKeys } from "@/lib/query-keys";

/**
 * Someone signed out here with no signal, so their session on the server could not be ended then:
 * end it now, before anything else is asked with it.
 */
export async function endPendingSignOut(): Promise<void> {
  if (!signOutPending()) return;
  try {
    await apiRequest("/api/auth/sign-out", { method: "POST" });
  } catch (error) {
    // Already over (401) is as good as ended; anything else tries again next time.
    if (!(isApiError(error) && error.status === 401)) throw error;
  }
  setSignOutPending(false);
}

/** The signed-in person and their roles, or null when nobody is signed in. */
export async function getMe({ signal }: { signal?: AbortSignal } = {}): Promise<MeResponse | null> {
  if (signOutPending()) {
    await endPendingSignOut();
    return null;
  }
  try {
    const me = await apiRequest("/api/auth/me", { schema: meResponseSchema, signal });
    rememberPhonePerson(me.user.id);
    return me;
  } catch (error) {
    if (isApiError(error) && error.status === 401) return null;
    throw error;
  }
}

export function meQueryOptions() {
  return queryOptions({
    queryKey: queryKeys.sessions.me,
    queryFn: ({ signal }) => getMe({ signal }),
    // Who is signed in changes only by signing in or out (both write this cache) or by the
    // session ending, which any other request notices; so it is never refetched on its own.
    staleTime: Infinity,
  });
}

export function useMe() {
  return useQuery(meQueryOptions());
}

/**
 * Someone has just signed in on this device (with a password, an invitation or a reset link). A
 * new person may be holding the phone: keep nothing the previous session loaded, except what the
 * page on screen still shows (`keep`, a key prefix), which would otherwise be fetched again.
 */
export function rememberSignedInPerson(
  queryClient: QueryClient,
  me: MeResponse,
  keep?: readonly unknown[],
): void {
  queryClient.removeQueries({
    predicate: (query) =>
      query.queryKey[0] !== queryKeys.sessions.me[0] &&
      !(keep && keep.every((part, index) => query.queryKey[index] === part)),
  });
  queryClient.setQueryData(queryKeys.sessions.me, me);
  rememberPhonePerson(me.user.id);
}
