import {
  type ObservationCommitteeResponse,
  observationCommitteeResponseSchema,
} from "@shared/schemas/observations";
import { keepPreviousData, queryOptions, useQuery } from "@tanstack/react-query";

import { apiRequest } from "@/lib/api-client";
import { queryKeys } from "@/lib/query-keys";

import { apiSearch, type CommitteePeriod } from "../lib/committee-view";

/** The months an observation figure covers: observations have no zone type filter of their own. */
export function observationPeriod(period: CommitteePeriod): { from: string; to: string } {
  return { from: period.from, to: period.to };
}

/** Observed putting-on and removal for the network and each site: breach rates, hand hygiene. */
export async function getObservationFigures(
  period: { from: string; to: string },
  { signal }: { signal?: AbortSignal } = {},
): Promise<ObservationCommitteeResponse> {
  return apiRequest(`/api/committee/observations${apiSearch(period)}`, {
    schema: observationCommitteeResponseSchema,
    signal,
  });
}

export function observationFiguresQueryOptions(period: CommitteePeriod) {
  const months = observationPeriod(period);
  return queryOptions({
    queryKey: queryKeys.committee.observations(months),
    queryFn: ({ signal }) => getObservationFigures(months, { signal }),
  });
}

export function useObservationFigures(period: CommitteePeriod, { enabled = true } = {}) {
  return useQuery({
    ...observationFiguresQueryOptions(period),
    enabled,
    placeholderData: keepPreviousData,
  });
}
