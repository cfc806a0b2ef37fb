import { type ScheduleEntry, scheduleResponseSchema } from "@shared/schemas/audits";
import { type QueryClient, queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** Every space of the site with its audit interval, last audit and due date. */
export async function getSiteSchedule(
  siteId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<ScheduleEntry[]> {
  const { entries } = await apiRequest(`/api/sites/${encodeURIComponent(siteId)}/schedule`, {
    schema: scheduleResponseSchema,
    signal,
  });
  return entries;
}

export function siteScheduleQueryOptions(siteId: string) {
  return queryOptions({
    queryKey: queryKeys.schedules.site(siteId),
    queryFn: ({ signal }) => getSiteSchedule(siteId, { signal }),
  });
}

export function useSiteSchedule(siteId: string) {
  return useQuery(siteScheduleQueryOptions(siteId));
}

/** A space's entry from any due list already loaded, or null. */
export function scheduledSpace(queryClient: QueryClient, spaceId: string): ScheduleEntry | null {
  for (const [, entries] of queryClient.getQueriesData<ScheduleEntry[]>({
    queryKey: queryKeys.schedules.all,
  })) {
    const found = entries?.find((entry) => entry.spaceId === spaceId);
    if (found) return found;
  }
  return null;
}

/** The name of a space from any schedule already loaded, to show before the server answers. */
export function scheduledSpaceName(queryClient: QueryClient, spaceId: string): string | null {
  for (const [, entries] of queryClient.getQueriesData<ScheduleEntry[]>({
    queryKey: queryKeys.schedules.all,
  })) {
    const found = entries?.find((entry) => entry.spaceId === spaceId);
    if (found) return found.spaceName;
  }
  return null;
}
