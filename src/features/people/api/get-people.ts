import { type PeopleListResponse, peopleListResponseSchema } from "@shared/schemas/people";
import { queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** The people the caller may manage, and where the caller may give roles. */
export function getPeople({ signal }: { signal?: AbortSignal } = {}): Promise<PeopleListResponse> {
  return apiRequest("/api/people", { schema: peopleListResponseSchema, signal });
}

export function peopleQueryOptions() {
  return queryOptions({
    queryKey: queryKeys.people.list,
    queryFn: ({ signal }) => getPeople({ signal }),
  });
}

export function usePeople() {
  return useQuery(peopleQueryOptions());
}
