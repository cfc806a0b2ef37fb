import type { QueryClient } from "@tanstack/react-query";
import { useCallback, useEffect, useMemo, useRef } from "react";
import { type LoaderFunctionArgs, useNavigation, useSearchParams } from "react-router-dom";

import { comparisonQueryOptions } from "@/features/committee/api/get-comparison";
import { pressureFiguresQueryOptions } from "@/features/committee/api/get-pressure-figures";
import { observationFiguresQueryOptions } from "@/features/committee/api/get-observation-figures";
import { trendsQueryOptions } from "@/features/committee/api/get-trends";
import { CommitteeOverview } from "@/features/committee/components/committee-overview";
import {
  type CommitteeView,
  periodOf,
  viewErrors,
  viewFromSearch,
  viewToSearch,
} from "@/features/committee/lib/committee-view";

import { isSignedIn } from "../session";

export function committeeLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const view = viewFromSearch(new URL(request.url).searchParams);
    if (Object.keys(viewErrors(view)).length === 0 && (await isSignedIn(queryClient))) {
      void queryClient.prefetchQuery(comparisonQueryOptions(view));
      void queryClient.prefetchQuery(trendsQueryOptions(periodOf(view)));
      void queryClient.prefetchQuery(observationFiguresQueryOptions(periodOf(view)));
      void queryClient.prefetchQuery(pressureFiguresQueryOptions(periodOf(view)));
    }
    return null;
  };
}

/** The committee view; period, zone type and the pair of sites live in the address. */
export function CommitteeRoute() {
  const [search, setSearch] = useSearchParams();
  const view = useMemo(() => viewFromSearch(search), [search]);
  // A move to another page may be under way when the comparison arrives; writing the default
  // pair into the address then would cancel that move and pull the person back here.
  const navigationState = useNavigation().state;
  const moving = useRef(false);
  useEffect(() => {
    moving.current = navigationState !== "idle";
  }, [navigationState]);
  // Merged into the address as it is now, not as this render saw it, so quick changes add up.
  const changeView = useCallback(
    (change: Partial<CommitteeView>, options?: { replace?: boolean }) => {
      if (options?.replace && moving.current) return;
      setSearch((current) => viewToSearch({ ...viewFromSearch(current), ...change }), {
        replace: options?.replace ?? false,
      });
    },
    [setSearch],
  );
  return (
    <>
      <title>Committee view · Lintel</title>
      <CommitteeOverview view={view} onViewChange={changeView} />
    </>
  );
}
