import type { QueryClient } from "@tanstack/react-query";
import { Link } from "react-router-dom";

import { paths } from "@/config/paths";
import { undeliveredMailQueryOptions } from "@/features/admin/api/get-undelivered-mail";
import { UndeliveredMailList } from "@/features/admin/components/undelivered-mail-list";
import { useAuthorization } from "@/lib/authorization";

import { signedInPersonMay } from "../session";
import { NotAvailable } from "./not-available";

export function undeliveredMailLoader(queryClient: QueryClient) {
  return async () => {
    if (await signedInPersonMay(queryClient, "resend:mail:network")) {
      void queryClient.prefetchQuery(undeliveredMailQueryOptions());
    }
    return null;
  };
}

export function UndeliveredMailRoute() {
  const { can } = useAuthorization();
  if (!can("resend:mail:network")) return <NotAvailable />;
  return (
    <>
      <title>E-mail that may not have arrived · Lintel</title>
      <p className="mb-2 text-sm">
        <Link to={paths.people.getHref()} className="font-semibold text-brand-700 underline">
          <span aria-hidden="true">← </span>People
        </Link>
      </p>
      <h1 className="text-2xl font-bold tracking-tight md:text-3xl">
        E-mail that may not have arrived
      </h1>
      <p className="mt-2 mb-6 text-ink-muted">
        E-mail to your network’s people that was interrupted while sending or refused by the mail
        server. Resend puts it back in the queue once, however often it is pressed; it keeps its
        identity, so a mail program that already has it can tell the copies apart. The people
        concerned also see corrective actions and fixes to check on their home page.
      </p>
      <UndeliveredMailList />
    </>
  );
}
