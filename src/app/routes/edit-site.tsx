import { siteParamsSchema } from "@shared/schemas/site";
import type { QueryClient } from "@tanstack/react-query";
import { type LoaderFunctionArgs, useNavigate, useParams } from "react-router-dom";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { EmptyState } from "@/components/ui/empty-state";
import { Spinner } from "@/components/ui/spinner";
import { TextLink } from "@/components/ui/text-link";
import { paths } from "@/config/paths";
import { duePolicyQueryOptions } from "@/features/actions/api/get-due-policy";
import { DuePolicyForm } from "@/features/actions/components/due-policy-form";
import { pressureSettingsQueryOptions } from "@/features/pressure-settings/api/get-pressure-settings";
import { PressureSettingsForm } from "@/features/pressure-settings/components/pressure-settings-form";
import { siteQueryOptions, useSite } from "@/features/sites/api/get-site";
import { EditSiteForm } from "@/features/sites/components/site-form";
import { SiteRetirement } from "@/features/sites/components/site-retirement";
import { UploadTokens } from "@/features/pressure-uploads/components/upload-tokens";
import { isApiError } from "@/lib/api-client";
import { useAuthorization } from "@/lib/authorization";

import { isSignedIn } from "../session";
import { NotAvailable } from "./not-available";

export function editSiteLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const parsed = siteParamsSchema.safeParse(params);
    if (parsed.success && (await isSignedIn(queryClient))) {
      void queryClient.prefetchQuery(siteQueryOptions(parsed.data.siteId));
      void queryClient.prefetchQuery(duePolicyQueryOptions(parsed.data.siteId));
      void queryClient.prefetchQuery(pressureSettingsQueryOptions(parsed.data.siteId));
    }
    return null;
  };
}

function SiteMissing() {
  return (
    <>
      <title>Site not found · Lintel</title>
      <EmptyState
        headingLevel={1}
        title="This site is not available"
        description="It may not exist, or you do not hold a role there."
        action={<TextLink to={paths.home.getHref()}>Back to my sites</TextLink>}
      />
    </>
  );
}

function EditSite({ siteId }: { siteId: string }) {
  const navigate = useNavigate();
  const { can } = useAuthorization();
  const site = useSite(siteId);

  if (site.isPending) return <Spinner label="Loading site…" className="py-8" />;
  if (site.isError) {
    if (isApiError(site.error) && site.error.status === 404) return <SiteMissing />;
    return (
      <Alert role="alert" tone="error" title="We could not load this site">
        <p>{site.error.message}</p>
        <Button variant="secondary" className="mt-3" onClick={() => void site.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  }

  return (
    <>
      <title>{`Edit ${site.data.name} · Lintel`}</title>
      <p className="text-sm">
        <TextLink to={paths.site.getHref(siteId)}>{site.data.name}</TextLink>
      </p>
      <h1 className="mt-2 text-2xl font-bold tracking-tight md:text-3xl">Edit site</h1>
      <Card className="mt-6">
        <EditSiteForm
          site={site.data}
          onSaved={() => void navigate(paths.site.getHref(siteId), { replace: true })}
        />
      </Card>
      <Card className="mt-6">
        <h2 className="mb-2 text-lg font-semibold">Due times for corrective actions</h2>
        <DuePolicyForm siteId={siteId} />
      </Card>
      <Card className="mt-6">
        <h2 className="mb-2 text-lg font-semibold">Room-pressure alarms</h2>
        <PressureSettingsForm siteId={siteId} />
      </Card>
      <Card className="mt-6">
        <UploadTokens siteId={siteId} />
      </Card>
      {can("create:site:network") ? (
        <div className="mt-6">
          <SiteRetirement
            siteId={siteId}
            siteName={site.data.name}
            onRetired={(notice) =>
              void navigate(paths.home.getHref(), { replace: true, state: { notice } })
            }
          />
        </div>
      ) : null}
    </>
  );
}

export function EditSiteRoute() {
  const { can } = useAuthorization();
  const parsed = siteParamsSchema.safeParse(useParams());
  if (!parsed.success) return <SiteMissing />;
  if (!can("update:site:site", parsed.data.siteId)) return <NotAvailable />;
  return <EditSite key={parsed.data.siteId} siteId={parsed.data.siteId} />;
}
