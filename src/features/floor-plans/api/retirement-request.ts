import { type RetirementResult, retirementResultSchema } from "@shared/schemas/retirement";
import type { QueryClient } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

/** POSTs a retire or restore step and returns what it did. */
export async function sendRetirement(path: string, reason?: string): Promise<RetirementResult> {
  const { retirement } = await apiRequest(path, {
    method: "POST",
    body: reason ? { reason } : {},
    schema: retirementResultSchema,
  });
  return retirement;
}

/**
 * A retirement or restore changes the map, the due list, QR sheets, action lists and site lists
 * at once, so every cached read is refreshed rather than patched one by one. The mutation does not
 * wait for the refresh: the refreshed list drops the row that was tapped, and a row gone before
 * its mutation settles would never hear of its success (nor say so to the person).
 */
export function afterRetirement(queryClient: QueryClient): void {
  void queryClient.invalidateQueries();
}
