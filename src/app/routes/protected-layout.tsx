import type { MeResponse } from "@shared/schemas/auth";
import { type QueryClient, useQueryClient } from "@tanstack/react-query";
import { lazy, Suspense } from "react";
import { type LoaderFunctionArgs, Outlet, redirect, useOutletContext } from "react-router-dom";

import { AppShell } from "@/components/layouts/app-shell";
import { PageSpinner } from "@/components/ui/spinner";
import { paths } from "@/config/paths";
import { useMe } from "@/features/auth/api/get-me";
import { AuthorizationProvider } from "@/lib/authorization";

import { useAuditSyncInBackground } from "../background-sync";
import { useKeptForOffline } from "../kept-in-background";
import { useNavigationItems } from "../navigation-items";
import { isSignedIn } from "../session";

// Loaded apart from the first screen: most pages never need the audit store.
const SyncStatusNote = lazy(() =>
  import("@/features/walkthroughs/components/sync-status").then((module) => ({
    default: module.SyncStatusNote,
  })),
);

function pathOf(url: { pathname: string; search: string }): string {
  return `${url.pathname}${url.search}`;
}

export function protectedLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    if (!(await isSignedIn(queryClient))) {
      throw redirect(paths.signIn.getHref(pathOf(new URL(request.url))));
    }
    return null;
  };
}

function SignedInFrame({ me }: { me: MeResponse }) {
  const navigationItems = useNavigationItems(me.roles);
  useAuditSyncInBackground();
  useKeptForOffline(useQueryClient(), me);
  return (
    <AuthorizationProvider grants={me.roles}>
      <AppShell
        navigationItems={navigationItems}
        homeHref={paths.home.getHref()}
        personName={me.user.name}
      >
        <Suspense fallback={null}>
          <SyncStatusNote quietWhenSaved className="mb-4 print:hidden" />
        </Suspense>
        <Outlet context={me} />
      </AppShell>
    </AuthorizationProvider>
  );
}

/** Everything behind sign-in: the app shell, with the signed-in person handed to each page. */
export function ProtectedLayout() {
  const me = useMe();

  // Whoever forgets the person (signing out, a request finding the session gone) also navigates
  // to the sign-in page; until that lands there is nothing to show.
  if (!me.data) return <PageSpinner />;

  return <SignedInFrame me={me.data} />;
}

/** The signed-in person, for pages inside the protected layout. */
export function useSignedInPerson(): MeResponse {
  return useOutletContext<MeResponse>();
}
