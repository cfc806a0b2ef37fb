import type { QueryClient } from "@tanstack/react-query";
import { useNavigate } from "react-router-dom";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Spinner } from "@/components/ui/spinner";
import { TextLink } from "@/components/ui/text-link";
import { paths } from "@/config/paths";
import { peopleQueryOptions, usePeople } from "@/features/people/api/get-people";
import { InviteForm } from "@/features/people/components/invite-form";
import { isApiError } from "@/lib/api-client";
import { useAuthorization } from "@/lib/authorization";

import { signedInPersonMay } from "../session";
import { NotAvailable } from "./not-available";
import type { PersonPageState } from "./person";

export function invitePersonLoader(queryClient: QueryClient) {
  return async () => {
    if (await signedInPersonMay(queryClient, "manage:people:site")) {
      void queryClient.prefetchQuery(peopleQueryOptions());
    }
    return null;
  };
}

function InvitePage() {
  const navigate = useNavigate();
  const people = usePeople();

  if (isApiError(people.error) && people.error.status === 403) return <NotAvailable />;

  return (
    <>
      <title>Invite someone · Lintel</title>
      <p className="text-sm">
        <TextLink to={paths.people.getHref()}>People</TextLink>
      </p>
      <h1 className="mt-2 text-2xl font-bold tracking-tight md:text-3xl">Invite someone</h1>
      <p className="mt-2 text-ink-muted">
        We e-mail them a link to choose a password. Until they do, they show as invited; you can
        send a new link from their page.
      </p>
      <Card className="mt-6">
        {people.isPending ? (
          <Spinner label="Loading your sites…" className="py-4" />
        ) : people.isError ? (
          <Alert role="alert" tone="error" title="We could not load your sites">
            <p>{people.error.message}</p>
            <Button variant="secondary" className="mt-3" onClick={() => void people.refetch()}>
              Try again
            </Button>
          </Alert>
        ) : (
          <InviteForm
            manageableSites={people.data.manageableSites}
            canGrantNetworkWide={people.data.canGrantNetworkWide}
            onInvited={(person) =>
              void navigate(paths.person.getHref(person.id), {
                state: { notice: `Invitation sent to ${person.email}.` } satisfies PersonPageState,
              })
            }
          />
        )}
      </Card>
    </>
  );
}

export function InvitePersonRoute() {
  const { canAnywhere } = useAuthorization();
  if (!canAnywhere("manage:people:site")) return <NotAvailable />;
  return <InvitePage />;
}
