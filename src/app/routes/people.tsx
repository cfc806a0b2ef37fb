import type { QueryClient } from "@tanstack/react-query";
import { Link } from "react-router-dom";

import { Alert } from "@/components/ui/alert";
import { Button, buttonStyles } from "@/components/ui/button";
import { Spinner } from "@/components/ui/spinner";
import { paths } from "@/config/paths";
import { peopleQueryOptions, usePeople } from "@/features/people/api/get-people";
import { PeopleTable } from "@/features/people/components/people-table";
import { isApiError } from "@/lib/api-client";
import { useAuthorization } from "@/lib/authorization";

import { signedInPersonMay } from "../session";
import { NotAvailable } from "./not-available";

export function peopleLoader(queryClient: QueryClient) {
  return async () => {
    if (await signedInPersonMay(queryClient, "manage:people:site")) {
      void queryClient.prefetchQuery(peopleQueryOptions());
    }
    return null;
  };
}

function PeopleList() {
  const people = usePeople();

  if (people.isPending) return <Spinner label="Loading people…" className="py-8" />;
  if (people.isError) {
    if (isApiError(people.error) && people.error.status === 403) return null;
    return (
      <Alert role="alert" tone="error" title="We could not load the people list">
        <p>{people.error.message}</p>
        <Button variant="secondary" className="mt-3" onClick={() => void people.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  }
  return <PeopleTable people={people.data.people} manageableSites={people.data.manageableSites} />;
}

function PeoplePage() {
  const people = usePeople();
  const { can } = useAuthorization();
  if (isApiError(people.error) && people.error.status === 403) return <NotAvailable />;

  return (
    <>
      <title>People · Lintel</title>
      <div className="flex flex-wrap items-end justify-between gap-4">
        <div>
          <h1 className="text-2xl font-bold tracking-tight md:text-3xl">People</h1>
          <p className="mt-2 text-ink-muted">
            Everyone you look after: invite colleagues, give and take away roles, and deactivate
            accounts that should no longer sign in.
          </p>
        </div>
        <div className="flex flex-wrap gap-3">
          {can("resend:mail:network") ? (
            <Link
              to={paths.undeliveredMail.getHref()}
              className={buttonStyles({ variant: "secondary" })}
            >
              E-mail that may not have arrived
            </Link>
          ) : null}
          <Link to={paths.invitePerson.getHref()} className={buttonStyles()}>
            Invite someone
          </Link>
        </div>
      </div>
      <div className="mt-6">
        <PeopleList />
      </div>
    </>
  );
}

export function PeopleRoute() {
  const { canAnywhere } = useAuthorization();
  if (!canAnywhere("manage:people:site")) return <NotAvailable />;
  return <PeoplePage />;
}
