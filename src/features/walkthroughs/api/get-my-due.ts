import { type MyDueEntry, myDueResponseSchema } from "@shared/schemas/audits";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** Overdue and soon-due spaces at every site where the signed-in person audits. */
export async function getMyDue({ signal }: { signal?: AbortSignal } = {}): Promise<MyDueEntry[]> {
  const { entries } = await apiRequest("/api/my/due", { schema: myDueResponseSchema, signal });
  return entries;
}

export function myDueQueryOptions() {
  return queryOptions({
    queryKey: queryKeys.schedules.mine,
    queryFn: ({ signal }) => getMyDue({ signal }),
  });
}

export function useMyDue() {
  return useQuery(myDueQueryOptions());
}
