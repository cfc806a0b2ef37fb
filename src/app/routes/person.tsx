import { personParamsSchema } from "@shared/schemas/people";
import type { QueryClient } from "@tanstack/react-query";
import { type LoaderFunctionArgs, useLocation, useParams } from "react-router-dom";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { EmptyState } from "@/components/ui/empty-state";
import { Spinner } from "@/components/ui/spinner";
import { TextLink } from "@/components/ui/text-link";
import { paths } from "@/config/paths";
import { peopleQueryOptions, usePeople } from "@/features/people/api/get-people";
import { personQueryOptions, usePerson } from "@/features/people/api/get-person";
import { PersonDetails } from "@/features/people/components/person-details";
import { isApiError } from "@/lib/api-client";
import { useAuthorization } from "@/lib/authorization";

import { signedInPersonMay } from "../session";
import { NotAvailable } from "./not-available";
import { useSignedInPerson } from "./protected-layout";

/** What the page before may hand over, e.g. after sending an invitation. */
export interface PersonPageState {
  notice?: string;
}

function noticeFrom(state: unknown): string | null {
  if (typeof state !== "object" || state === null || !("notice" in state)) return null;
  return typeof state.notice === "string" ? state.notice : null;
}

export function personLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const parsed = personParamsSchema.safeParse(params);
    if (parsed.success && (await signedInPersonMay(queryClient, "manage:people:site"))) {
      void queryClient.prefetchQuery(personQueryOptions(parsed.data.userId));
      void queryClient.prefetchQuery(peopleQueryOptions());
    }
    return null;
  };
}

function PersonNotFound() {
  return (
    <>
      <title>Person not found · Lintel</title>
      <EmptyState
        headingLevel={1}
        title="This person is not available"
        description="They may not exist, or they hold no role at a site where you manage people."
        action={<TextLink to={paths.people.getHref()}>Back to people</TextLink>}
      />
    </>
  );
}

function PersonPage({ userId }: { userId: string }) {
  const me = useSignedInPerson();
  const { state } = useLocation();
  const person = usePerson(userId);
  const people = usePeople();

  if (person.isPending || people.isPending) {
    return <Spinner label="Loading person…" className="py-8" />;
  }
  const error = person.error ?? people.error;
  if (error) {
    if (isApiError(error) && error.status === 404) return <PersonNotFound />;
    if (isApiError(error) && error.status === 403) return <NotAvailable />;
    return (
      <>
        <h1 className="mb-4 text-2xl font-bold tracking-tight">Person</h1>
        <Alert role="alert" tone="error" title="We could not load this person">
          <p>{error.message}</p>
          <Button
            variant="secondary"
            className="mt-3"
            onClick={() => void Promise.all([person.refetch(), people.refetch()])}
          >
            Try again
          </Button>
        </Alert>
      </>
    );
  }
  if (!person.data || !people.data) return null;

  return (
    <>
      <title>{`${person.data.name} · People · Lintel`}</title>
      <p className="text-sm">
        <TextLink to={paths.people.getHref()}>People</TextLink>
      </p>
      <PersonDetails
        person={person.data}
        manageableSites={people.data.manageableSites}
        canGrantNetworkWide={people.data.canGrantNetworkWide}
        currentUserId={me.user.id}
        notice={noticeFrom(state)}
      />
    </>
  );
}

export function PersonRoute() {
  const { canAnywhere } = useAuthorization();
  const parsed = personParamsSchema.safeParse(useParams());
  if (!canAnywhere("manage:people:site")) return <NotAvailable />;
  if (!parsed.success) return <PersonNotFound />;
  return <PersonPage key={parsed.data.userId} userId={parsed.data.userId} />;
}
