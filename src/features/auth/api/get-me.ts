import { type MeResponse, meResponseSchema } from "@shared/schemas/shell";
import { type QueryClient, queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest, isApiError } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** The signed-in person and their roles, or null when nobody is signed in. */
export async function getMe({ signal }: { signal?: AbortSignal } = {}): Promise<MeResponse | null> {
  try {
    return await apiRequest("/api/auth/me", { schema: meResponseSchema, signal });
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
}
