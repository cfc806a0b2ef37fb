import type { QueryClient } from "@tanstack/react-query";

import { checklistsQueryOptions } from "@/features/admin/api/get-checklists";
import { floorOfSpaceQueryOptions } from "@/features/floor-plans/api/get-floor";

/**
 * What a QR code's audit starts from, asked of Lintel as the app starts, alongside the start's
 * own code: the space's floor and the published checklists. The start then builds the audit on
 * the phone at once, rather than waiting for Lintel to start it and answer. A failed ask is
 * harmless: the start asks again, or waits for Lintel's own copy of the audit.
 */
export function askForQrStartData(queryClient: QueryClient, spaceId: string): void {
  void queryClient.prefetchQuery({
    ...floorOfSpaceQueryOptions(queryClient, spaceId),
    retry: false,
  });
  void queryClient.prefetchQuery({ ...checklistsQueryOptions(), retry: false });
}
