import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { Spinner } from "@/components/ui/spinner";
import { paths } from "@/config/paths";

import { useSites } from "../api/get-sites";
import { SiteCard } from "./site-card";

export function SitesList() {
  const sites = useSites();

  if (sites.isPending) return <Spinner label="Loading your sites…" className="py-8" />;

  if (sites.isError) {
    return (
      <Alert role="alert" tone="error" title="We could not load your sites">
        <p>{sites.error.message}</p>
        <Button variant="secondary" className="mt-3" onClick={() => void sites.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  }

  if (sites.data.length === 0) {
    return (
      <EmptyState
        title="You have no sites yet"
        description="Ask your administrator to give you a role at a site. It will appear here as soon as they do."
      />
    );
  }

  return (
    <ul aria-label="Sites" className="grid gap-4 sm:grid-cols-2 xl:grid-cols-3">
      {sites.data.map((site) => (
        <li key={site.id}>
          <SiteCard site={site} href={paths.site.getHref(site.id)} />
        </li>
      ))}
    </ul>
  );
}
