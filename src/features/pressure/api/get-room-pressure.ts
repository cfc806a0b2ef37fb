import {
  type PressureRange,
  type PressureSpaceResponse,
  pressureSpaceResponseSchema,
} from "@shared/schemas/pressure-space";
import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

/** A room's pressure: its monitor, the live value, the range's series, table and alarms. */
export async function getRoomPressure(
  spaceId: string,
  range: PressureRange,
  { signal }: { signal?: AbortSignal } = {},
): Promise<PressureSpaceResponse> {
  return apiRequest(
    `/api/spaces/${encodeURIComponent(spaceId)}/pressure?range=${encodeURIComponent(range)}`,
    { schema: pressureSpaceResponseSchema, signal },
  );
}

/** Refreshed every 30 seconds while the page is open: the value is live. */
export function roomPressureQueryOptions(spaceId: string, range: PressureRange) {
  return queryOptions({
    queryKey: queryKeys.roomPressures.range(spaceId, range),
    queryFn: ({ signal }) => getRoomPressure(spaceId, range, { signal }),
    refetchInterval: 30_000,
    placeholderData: keepPreviousData,
  });
}

export function useRoomPressure(spaceId: string, range: PressureRange, enabled = true) {
  return useQuery({ ...roomPressureQueryOptions(spaceId, range), enabled });
}
