import { type Person, personResponseSchema } from "@shared/schemas/people";
import { type QueryClient, queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

export async function getPerson(
  userId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<Person> {
  const { person } = await apiRequest(`/api/people/${encodeURIComponent(userId)}`, {
    schema: personResponseSchema,
    signal,
  });
  return person;
}

export function personQueryOptions(userId: string) {
  return queryOptions({
    queryKey: queryKeys.people.detail(userId),
    queryFn: ({ signal }) => getPerson(userId, { signal }),
  });
}

export function usePerson(userId: string) {
  return useQuery(personQueryOptions(userId));
}

/**
 * After any change to a person: show the server's answer at once, and have the list and the
 * person's page read again so nothing stale lingers.
 */
export async function personChanged(queryClient: QueryClient, person: Person): Promise<void> {
  queryClient.setQueryData(queryKeys.people.detail(person.id), person);
  await Promise.all([
    queryClient.invalidateQueries({ queryKey: queryKeys.people.list }),
    queryClient.invalidateQueries({ queryKey: queryKeys.people.detail(person.id) }),
  ]);
}
