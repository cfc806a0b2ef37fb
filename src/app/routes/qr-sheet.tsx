import { siteParamsSchema } from "@shared/schemas/site";
import type { QueryClient } from "@tanstack/react-query";
import { type LoaderFunctionArgs, useParams } from "react-router-dom";

import { TextLink } from "@/components/ui/text-link";
import { paths } from "@/config/paths";
import { siteQueryOptions, useSite } from "@/features/sites/api/get-site";
import { siteScheduleQueryOptions } from "@/features/walkthroughs/api/get-site-schedule";
import { QrSheet } from "@/features/walkthroughs/components/qr-sheet";
import { useAuthorization } from "@/lib/authorization";

import { signedInPersonMay } from "../session";
import { NotAvailable } from "./not-available";

export function qrSheetLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const parsed = siteParamsSchema.safeParse(params);
    if (parsed.success && (await signedInPersonMay(queryClient, "update:site:site"))) {
      void queryClient.prefetchQuery(siteQueryOptions(parsed.data.siteId));
      void queryClient.prefetchQuery(siteScheduleQueryOptions(parsed.data.siteId));
    }
    return null;
  };
}

const addressFor = (spaceId: string) =>
  `${window.location.origin}${paths.startAudit.getHref(spaceId)}`;

function QrSheetPage({ siteId }: { siteId: string }) {
  const site = useSite(siteId);
  const siteName = site.data?.name;
  return (
    <>
      <title>{`QR codes · ${siteName ?? "Site"} · Lintel`}</title>
      <p className="text-sm print:hidden">
        <TextLink to={paths.siteDue.getHref(siteId)}>Back to what is due</TextLink>
      </p>
      <h1 className="mt-2 text-2xl font-bold tracking-tight md:text-3xl print:mt-0 print:text-xl">
        QR codes{siteName ? ` for ${siteName}` : ""}
      </h1>
      <p className="mt-1 mb-6 text-ink-muted print:mb-4 print:text-sm">
        Scan a code with the phone&apos;s camera to open that space&apos;s audit in Lintel.
      </p>
      <QrSheet siteId={siteId} addressFor={addressFor} />
    </>
  );
}

/** A printable sheet of codes, one per space, for administrators of the site. */
export function QrSheetRoute() {
  const { can } = useAuthorization();
  const parsed = siteParamsSchema.safeParse(useParams());
  if (!parsed.success) return <NotAvailable description="There is no site at this address." />;
  if (!can("update:site:site", parsed.data.siteId)) {
    return <NotAvailable description="Administrators of this site print its QR codes." />;
  }
  return <QrSheetPage key={parsed.data.siteId} siteId={parsed.data.siteId} />;
}
