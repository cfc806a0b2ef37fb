import type { QueryClient } from "@tanstack/react-query";

import { sitesQueryOptions } from "@/features/sites/api/get-sites";
import { SitesList } from "@/features/sites/components/sites-list";

import { isSignedIn } from "../session";
import { useSignedInPerson } from "./protected-layout";

export function homeLoader(queryClient: QueryClient) {
  return async () => {
    if (await isSignedIn(queryClient)) void queryClient.prefetchQuery(sitesQueryOptions());
    return null;
  };
}

function firstName(name: string): string {
  return name.trim().split(/\s+/)[0] ?? name;
}

export function HomeRoute() {
  const me = useSignedInPerson();
  return (
    <>
      <title>My sites · Lintel</title>
      <h1 className="text-2xl font-bold tracking-tight md:text-3xl">My sites</h1>
      <p className="mt-2 mb-6 text-ink-muted">
        Hello {firstName(me.user.name)}. These are the sites where you hold a role.
      </p>
      <SitesList />
    </>
  );
}
