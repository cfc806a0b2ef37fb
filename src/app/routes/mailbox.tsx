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
  "Demo e-mails exist only in the demo, while Lintel keeps its mail on this machine (npm start without an SMTP server). A real deployment sends real e-mail to people's own inboxes.";

function MailboxPage() {
  const appConfig = useAppConfig();

  if (appConfig.isPending) return <Spinner label="Loading…" className="py-8" />;
  if (appConfig.isError) {
    return (
      <Alert role="alert" tone="error" title="We could not open the demo e-mails">
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
      <title>Demo e-mails · Lintel</title>
      <h1 className="text-2xl font-bold tracking-tight md:text-3xl">Demo e-mails</h1>
      <p className="mt-2 text-ink-muted">
        The e-mails Lintel has sent to the people of your network, kept here so you can read them.
      </p>
      <Alert tone="info" title="Only in the demo" className="mt-3 mb-6">
        <p>
          Nothing here leaves this machine. A real deployment sends real e-mail to each person's own
          inbox instead, and this page is not there.
        </p>
      </Alert>
      <Mailbox />
    </>
  );
}

export function MailboxRoute() {
  const { canAnywhere } = useAuthorization();
  if (!canAnywhere("read:dev-mailbox:network")) return <NotAvailable />;
  return <MailboxPage />;
}
