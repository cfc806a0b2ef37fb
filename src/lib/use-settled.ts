import { useQueries, type UseQueryOptions } from "@tanstack/react-query";

// Any query's options: only the key and the fetch matter here, never the data's type.
// eslint-disable-next-line @typescript-eslint/no-explicit-any
type AnyQueryOptions = UseQueryOptions<any, any, any, any>;

/**
 * Whether every query a page shows on its first screen has an answer (data, an error, or a first
 * failed try). A page that reveals its sections only then draws each one once, at its final size,
 * instead of letting each list push the next down the screen as it arrives. Leave out (`false`) what the person's
 * roles do not show. The sections' own hooks share these queries: nothing is fetched twice.
 */
export function useSettled(queries: readonly (AnyQueryOptions | false)[]): boolean {
  return useQueries({
    queries: queries.filter((query): query is AnyQueryOptions => query !== false),
    // A list whose first try failed no longer holds the page: it shows its own retry or error.
    combine: (results) => results.every((result) => !result.isLoading || result.failureCount > 0),
  });
}
