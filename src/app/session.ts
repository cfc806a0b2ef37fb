import type { QueryClient } from "@tanstack/react-query";

import { meQueryOptions } from "@/features/auth/api/get-me";

/**
 * Whether someone is signed in, from the cache when known. Route loaders call it before
 * prefetching so a signed-out visit sends no requests that can only fail.
 */
export async function isSignedIn(queryClient: QueryClient): Promise<boolean> {
  return (await queryClient.ensureQueryData(meQueryOptions())) !== null;
}

/** Forget the signed-in person; the caller then sends them to the sign-in page. */
export function forgetSignedInPerson(queryClient: QueryClient): void {
  queryClient.setQueryData(meQueryOptions().queryKey, null);
}
