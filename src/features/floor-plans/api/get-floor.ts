import { type Floor, type FloorDetail, floorDetailResponseSchema } from "@shared/schemas/floors";
import { type QueryClient, queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** One floor with its suites, spaces and fixtures. */
export function getFloor(
  floorId: string,
  { signal }: { signal?: AbortSignal } = {},
): Promise<FloorDetail> {
  return apiRequest(`/api/floors/${encodeURIComponent(floorId)}`, {
    schema: floorDetailResponseSchema,
    signal,
  });
}

export function floorQueryOptions(floorId: string) {
  return queryOptions({
    queryKey: queryKeys.floors.detail(floorId),
    queryFn: ({ signal }) => getFloor(floorId, { signal }),
  });
}

/**
 * The floor a space is on, asked by the space's id: a QR code names only the space. The answer is
 * kept under the floor's own key, where the floor's screen and `cachedSpace` find it.
 */
export function floorOfSpaceQueryOptions(queryClient: QueryClient, spaceId: string) {
  return queryOptions({
    queryKey: queryKeys.floors.ofSpace(spaceId),
    queryFn: async ({ signal }) => {
      const detail = await apiRequest(`/api/spaces/${encodeURIComponent(spaceId)}/floor`, {
        schema: floorDetailResponseSchema,
        signal,
      });
      queryClient.setQueryData(floorQueryOptions(detail.floor.id).queryKey, detail);
      return detail.floor.id;
    },
  });
}

export function useFloor(floorId: string) {
  return useQuery(floorQueryOptions(floorId));
}

/**
 * Applies a change the server has confirmed to the cached floor at once, so the map answers the
 * tap without waiting, then refetches to stay in step with edits made elsewhere.
 */
export function floorDetailChanged(
  queryClient: QueryClient,
  floorId: string,
  change: (detail: FloorDetail) => FloorDetail,
): Promise<void> {
  queryClient.setQueryData(floorQueryOptions(floorId).queryKey, (detail) =>
    detail ? change(detail) : detail,
  );
  return queryClient.invalidateQueries({ queryKey: queryKeys.floors.detail(floorId) });
}

/** After the floor itself changed (plan, scale): the detail and the site's floor list. */
export function floorChanged(queryClient: QueryClient, floor: Floor): Promise<unknown> {
  return Promise.all([
    floorDetailChanged(queryClient, floor.id, (detail) => ({ ...detail, floor })),
    queryClient.invalidateQueries({ queryKey: queryKeys.floors.list(floor.siteId) }),
  ]);
}

/** A space with its floor, from any floor already loaded (or kept on the phone), or null. */
export function cachedSpace(
  queryClient: QueryClient,
  spaceId: string,
): { space: FloorDetail["spaces"][number]; floor: FloorDetail["floor"] } | null {
  for (const [, detail] of queryClient.getQueriesData<FloorDetail>({
    queryKey: queryKeys.floors.details,
  })) {
    const space = detail?.spaces.find((candidate) => candidate.id === spaceId);
    if (space) return { space, floor: detail!.floor };
  }
  return null;
}

/** A space's name from any floor already loaded, or null. */
export function cachedSpaceName(queryClient: QueryClient, spaceId: string): string | null {
  for (const [, detail] of queryClient.getQueriesData<FloorDetail>({
    queryKey: queryKeys.floors.details,
  })) {
    const space = detail?.spaces.find((candidate) => candidate.id === spaceId);
    if (space) return space.name;
  }
  return null;
}
