import type { Permission } from "@shared/permissions";
import { onlineManager, type QueryClient } from "@tanstack/react-query";

import { meQueryOptions } from "@/features/auth/api/get-me";
import { canAnywhere } from "@/lib/authorization";
import { phonePersonId } from "@/lib/phone-person";

/**
 * Whether someone is signed in, from the cache when known. Route loaders call it before
 * prefetching so a signed-out visit sends no requests that can only fail.
 */
export async function isSignedIn(queryClient: QueryClient): Promise<boolean> {
  // With no signal, the person this phone keeps lists for is still the one signed in here.
  if (!onlineManager.isOnline() && phonePersonId()) {
    await import("./kept-data").then((module) => module.restoreKept(queryClient));
  }
  return (await queryClient.ensureQueryData(meQueryOptions())) !== null;
}

/** Forget the signed-in person; the caller then sends them to the sign-in page. */
export function forgetSignedInPerson(queryClient: QueryClient): void {
  queryClient.setQueryData(meQueryOptions().queryKey, null);
}

/**
 * Whether the signed-in person may use a page that needs this permission somewhere. Loaders ask
 * before prefetching, so a page the person cannot use sends no request the server would refuse.
 */
export async function signedInPersonMay(
  queryClient: QueryClient,
  permission: Permission,
): Promise<boolean> {
  const me = await queryClient.ensureQueryData(meQueryOptions());
  return me !== null && canAnywhere(me.roles, permission);
}
