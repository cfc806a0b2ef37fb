import {
  type CommitteePressureResponse,
  committeePressureResponseSchema,
} from "@shared/schemas/committee-pressure";
import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

import { apiSearch, type CommitteePeriod } from "../lib/committee-view";

/** Room pressure per readable site and month: hours out of range, excursion rates. */
export async function getPressureFigures(
  period: CommitteePeriod,
  { signal }: { signal?: AbortSignal } = {},
): Promise<CommitteePressureResponse> {
  return apiRequest(`/api/committee/pressure${apiSearch(period)}`, {
    schema: committeePressureResponseSchema,
    signal,
  });
}

export function pressureFiguresQueryOptions(period: CommitteePeriod) {
  return queryOptions({
    queryKey: queryKeys.committee.pressure(period),
    queryFn: ({ signal }) => getPressureFigures(period, { signal }),
  });
}

export function usePressureFigures(period: CommitteePeriod, { enabled = true } = {}) {
  return useQuery({
    ...pressureFiguresQueryOptions(period),
    enabled,
    placeholderData: keepPreviousData,
  });
}
