import type { QueryClient } from "@tanstack/react-query";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Spinner } from "@/components/ui/spinner";
import { appConfigQueryOptions, useAppConfig } from "@/features/admin/api/get-app-config";
import { mailboxQueryOptions } from "@/features/admin/api/get-mailbox";
import { Mailbox } from "@/features/admin/components/mailbox";
import { useAuthorization } from "@/lib/authorization";

import { signedInPersonMay } from "../session";
import { NotAvailable } from "./not-available";

export function mailboxLoader(queryClient: QueryClient) {
  return async () => {
    if (await signedInPersonMay(queryClient, "read:dev-mailbox:network")) {
      const config = await queryClient.fetchQuery(appConfigQueryOptions()).catch(() => null);
      if (config?.demoMailbox) void queryClient.prefetchQuery(mailboxQueryOptions());
    }
    return null;
  };
}

const onlyWithMailCatcher =
  "The mailbox exists only while Lintel runs its local mail catcher (npm start without an SMTP server). Real installations send mail to real inboxes.";

function MailboxPage() {
  const appConfig = useAppConfig();

  if (appConfig.isPending) return <Spinner label="Loading…" className="py-8" />;
  if (appConfig.isError) {
    return (
      <Alert role="alert" tone="error" title="We could not open the mailbox">
        <p>{appConfig.error.message}</p>
        <Button variant="secondary" className="mt-3" onClick={() => void appConfig.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  }
  if (!appConfig.data.demoMailbox) return <NotAvailable description={onlyWithMailCatcher} />;

  return (
    <>
      <title>Mailbox · Lintel</title>
      <h1 className="text-2xl font-bold tracking-tight md:text-3xl">Mailbox</h1>
      <p className="mt-2 mb-6 text-ink-muted">
        This is the local mail catcher: e-mail Lintel sends to the people of your network lands
        here, so nothing leaves this machine.
      </p>
      <Mailbox />
    </>
  );
}

export function MailboxRoute() {
  const { canAnywhere } = useAuthorization();
  if (!canAnywhere("read:dev-mailbox:network")) return <NotAvailable />;
  return <MailboxPage />;
}
