import { useNavigate } from "react-router-dom";

import { Card } from "@/components/ui/card";
import { TextLink } from "@/components/ui/text-link";
import { paths } from "@/config/paths";
import { CreateSiteForm } from "@/features/sites/components/site-form";
import { useAuthorization } from "@/lib/authorization";

import { NotAvailable } from "./not-available";

export function NewSiteRoute() {
  const { can } = useAuthorization();
  const navigate = useNavigate();
  if (!can("create:site:network")) return <NotAvailable />;

  return (
    <>
      <title>Add a site · Lintel</title>
      <p className="text-sm">
        <TextLink to={paths.home.getHref()}>My sites</TextLink>
      </p>
      <h1 className="mt-2 text-2xl font-bold tracking-tight md:text-3xl">Add a site</h1>
      <p className="mt-2 text-ink-muted">
        A hospital or centre in the network. Its time zone decides when corrective actions fall due;
        its floors and plans are added on the site&apos;s page.
      </p>
      <Card className="mt-6">
        <CreateSiteForm
          onCreated={(site) => void navigate(paths.site.getHref(site.id), { replace: true })}
        />
      </Card>
    </>
  );
}
