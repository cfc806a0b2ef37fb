import { type MyDueEntry, myDueResponseSchema } from "@shared/schemas/audits";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";

/** Overdue and soon-due spaces at every site where the signed-in person audits. */
export async function getMyDue({ signal }: { signal?: AbortSignal } = {}): Promise<MyDueEntry[]> {
  const { entries } = await apiRequest("/api/my/due", { schema: myDueResponseSchema, signal });
  return entries;
}

export function myDueQueryOptions() {
  return queryOptions({
    queryKey: ["schedules", "mine"] as const,
    queryFn: ({ signal }) => getMyDue({ signal }),
  });
}

export function useMyDue() {
  return useQuery(myDueQueryOptions());
}
