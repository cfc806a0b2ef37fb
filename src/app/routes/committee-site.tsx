import { committeeSiteParamsSchema } from "@shared/schemas/committee";
import type { QueryClient } from "@tanstack/react-query";
import { useMemo } from "react";
import { type LoaderFunctionArgs, useParams, useSearchParams } from "react-router-dom";

import { committeeSiteQueryOptions } from "@/features/committee/api/get-committee-site";
import { pressureFiguresQueryOptions } from "@/features/committee/api/get-pressure-figures";
import { CommitteeSiteSpaces } from "@/features/committee/components/committee-site-spaces";
import { periodOf, viewErrors, viewFromSearch } from "@/features/committee/lib/committee-view";

import { isSignedIn } from "../session";
import { NotAvailable } from "./not-available";

export function committeeSiteLoader(queryClient: QueryClient) {
  return async ({ params, request }: LoaderFunctionArgs) => {
    const parsed = committeeSiteParamsSchema.safeParse(params);
    const period = periodOf(viewFromSearch(new URL(request.url).searchParams));
    if (
      parsed.success &&
      Object.keys(viewErrors(period)).length === 0 &&
      (await isSignedIn(queryClient))
    ) {
      void queryClient.prefetchQuery(committeeSiteQueryOptions(parsed.data.siteId, period));
      void queryClient.prefetchQuery(pressureFiguresQueryOptions(period));
    }
    return null;
  };
}

/** A site's spaces for the committee, for the period in the address. */
export function CommitteeSiteRoute() {
  const parsed = committeeSiteParamsSchema.safeParse(useParams());
  const [search] = useSearchParams();
  const period = useMemo(() => periodOf(viewFromSearch(search)), [search]);
  if (!parsed.success) return <NotAvailable description="There is no site at this address." />;
  return (
    <CommitteeSiteSpaces key={parsed.data.siteId} siteId={parsed.data.siteId} period={period} />
  );
}
