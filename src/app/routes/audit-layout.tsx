import type { MeResponse } from "@shared/schemas/auth";
import { type QueryClient, useQueryClient } from "@tanstack/react-query";
import { Link, type LoaderFunctionArgs, Outlet, redirect } from "react-router-dom";

import { BrandMark } from "@/components/ui/brand-mark";
import { paths } from "@/config/paths";
import { meQueryOptions, useMe } from "@/features/auth/api/get-me";
import { SyncStatusNote } from "@/features/walkthroughs/components/sync-status";
import { AuthorizationProvider } from "@/lib/authorization";

import { useAuditSyncInBackground } from "../background-sync";
import { useKeptForOffline } from "../kept-in-background";

function signInHref(request: Request): string {
  const url = new URL(request.url);
  return paths.signIn.getHref(`${url.pathname}${url.search}`);
}

/**
 * Audits open without a network: the phone holds them. So the sign-in check asks the server only
 * when it can be reached, and a connection failure lets the page open rather than stopping it.
 */
export function auditLayoutLoader(queryClient: QueryClient) {
  return async ({ request }: LoaderFunctionArgs) => {
    const known = queryClient.getQueryData(meQueryOptions().queryKey);
    if (known === null) throw redirect(signInHref(request));
    if (known !== undefined || !navigator.onLine) return null;
    let me: MeResponse | null;
    try {
      me = await queryClient.fetchQuery({ ...meQueryOptions(), retry: false });
    } catch {
      return null;
    }
    if (me === null) throw redirect(signInHref(request));
    return null;
  };
}

/**
 * The frame for auditing: the whole screen for the checklist, with the brand, a way home and the
 * sync status; no bottom navigation to tap by mistake.
 */
export function AuditLayout() {
  const me = useMe();
  useAuditSyncInBackground();
  useKeptForOffline(useQueryClient(), me.data ?? null);
  const grants = me.data?.roles ?? [];

  return (
    <AuthorizationProvider grants={grants}>
      <div className="min-h-dvh bg-surface-sunken text-ink">
        <a
          href="#main-content"
          className="sr-only z-50 rounded-lg bg-brand-700 font-semibold text-white focus:not-sr-only focus:fixed focus:top-3 focus:left-3 focus:px-4 focus:py-3"
        >
          Skip to content
        </a>
        <header className="sticky top-0 z-20 border-b border-surface-line bg-surface/95 backdrop-blur">
          <div className="mx-auto flex min-h-16 max-w-2xl items-center justify-between gap-3 px-4 py-2">
            <Link
              to={paths.home.getHref()}
              className="inline-flex min-h-tap items-center gap-2 rounded-lg font-semibold text-brand-800"
            >
              <BrandMark className="size-7" />
              <span className="max-[420px]:sr-only">My sites</span>
            </Link>
            {/* The header keeps room for a two-line status, so the screen below does not move
                as the status changes length while an audit starts and sends. */}
            <SyncStatusNote className="leading-tight" />
          </div>
        </header>
        <main
          id="main-content"
          tabIndex={-1}
          className="mx-auto w-full max-w-2xl px-4 pt-5 pb-6 outline-none"
        >
          <Outlet context={me.data ?? null} />
        </main>
      </div>
    </AuthorizationProvider>
  );
}
