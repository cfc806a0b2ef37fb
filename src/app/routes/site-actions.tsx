import { siteParamsSchema } from "@shared/schemas/site";
import type { QueryClient } from "@tanstack/react-query";
import { useMemo } from "react";
import { type LoaderFunctionArgs, useParams, useSearchParams } from "react-router-dom";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Spinner } from "@/components/ui/spinner";
import { TextLink } from "@/components/ui/text-link";
import { paths } from "@/config/paths";
import { siteActionsExportHref } from "@/features/actions/api/export-site-actions";
import { siteActionsQueryOptions, useSiteActions } from "@/features/actions/api/get-site-actions";
import { ActionsTable } from "@/features/actions/components/actions-table";
import {
  type ActionTableFilters,
  filtersFromSearch,
  filtersToQuery,
  filtersToSearch,
} from "@/features/actions/lib/action-filters";
import { siteQueryOptions, useSite } from "@/features/sites/api/get-site";

import { isSignedIn } from "../session";
import { NotAvailable } from "./not-available";

// The table filters on the phone; it loads the whole list once so changing a filter is instant.
const wholeList = { state: "all" } as const;

export function siteActionsLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const parsed = siteParamsSchema.safeParse(params);
    if (parsed.success && (await isSignedIn(queryClient))) {
      void queryClient.prefetchQuery(siteQueryOptions(parsed.data.siteId));
      void queryClient.prefetchQuery(siteActionsQueryOptions(parsed.data.siteId, wholeList));
    }
    return null;
  };
}

function SiteActionsPage({ siteId }: { siteId: string }) {
  const site = useSite(siteId);
  const actions = useSiteActions(siteId, wholeList);
  const [search, setSearch] = useSearchParams();
  const filters = useMemo(() => filtersFromSearch(search), [search]);
  const siteName = site.data?.name;
  const changeFilters = (next: ActionTableFilters) =>
    setSearch(filtersToSearch(next), { replace: true });

  return (
    <>
      <title>{`Corrective actions · ${siteName ?? "Site"} · Lintel`}</title>
      <p className="text-sm">
        <TextLink to={paths.site.getHref(siteId)}>{siteName ?? "Back to the site"}</TextLink>
      </p>
      <h1 className="mt-2 text-2xl font-bold tracking-tight md:text-3xl">Corrective actions</h1>
      <p className="mt-1 mb-6 text-ink-muted">
        Every action{siteName ? ` at ${siteName}` : ""}: not done yet first, overdue first, then by
        due time. Tap a column heading to sort by it.
      </p>
      {actions.isPending ? (
        <Spinner label="Loading actions…" className="py-8" />
      ) : actions.isError ? (
        <Alert role="alert" tone="error" title="We could not load the actions">
          <p>{actions.error.message}</p>
          <Button variant="secondary" className="mt-3" onClick={() => void actions.refetch()}>
            Try again
          </Button>
        </Alert>
      ) : (
        <ActionsTable
          actions={actions.data}
          filters={filters}
          onFiltersChange={changeFilters}
          actionHref={paths.action.getHref}
          exportHref={siteActionsExportHref(siteId, filtersToQuery(filters))}
        />
      )}
    </>
  );
}

export function SiteActionsRoute() {
  const parsed = siteParamsSchema.safeParse(useParams());
  if (!parsed.success) return <NotAvailable description="There is no site at this address." />;
  return <SiteActionsPage key={parsed.data.siteId} siteId={parsed.data.siteId} />;
}
