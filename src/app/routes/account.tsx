import { type RoleGrant, roleLabels } from "@shared/roles";
import type { Site } from "@shared/schemas/site";
import type { QueryClient } from "@tanstack/react-query";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { CautionNote } from "@/components/ui/caution-note";
import { Spinner } from "@/components/ui/spinner";
import { ChangePasswordForm } from "@/features/auth/components/change-password-form";
import { ProfileForm } from "@/features/auth/components/profile-form";
import { sitesQueryOptions, useSites } from "@/features/sites/api/get-sites";
import { canAnywhere } from "@/lib/authorization";

import { isSignedIn } from "../session";
import { OfflineStorageNote } from "../offline-storage-note";
import { SignOutPanel } from "../sign-out-panel";
import { useSignedInPerson } from "./protected-layout";

export function accountLoader(queryClient: QueryClient) {
  return async () => {
    if (await isSignedIn(queryClient)) void queryClient.prefetchQuery(sitesQueryOptions());
    return null;
  };
}

function siteNameOf(grant: RoleGrant, sites: readonly Site[]): string {
  if (grant.siteId === null) return "Every site in the network";
  return sites.find((site) => site.id === grant.siteId)?.name ?? "A site no longer listed";
}

function RolesList({ grants }: { grants: readonly RoleGrant[] }) {
  const sites = useSites();

  if (grants.length === 0) {
    return (
      <p className="text-ink-muted">
        You hold no roles yet. Ask your administrator to give you a role at a site.
      </p>
    );
  }
  if (sites.isPending) return <Spinner label="Loading your roles…" />;
  if (sites.isError) {
    return (
      <Alert role="alert" tone="error" title="We could not load the site names">
        <p>{sites.error.message}</p>
        <Button variant="secondary" className="mt-3" onClick={() => void sites.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  }

  // Network-wide roles first, then by site name.
  const rows = grants
    .map((grant) => ({ grant, siteName: siteNameOf(grant, sites.data) }))
    .sort(
      (a, b) =>
        Number(a.grant.siteId !== null) - Number(b.grant.siteId !== null) ||
        a.siteName.localeCompare(b.siteName),
    );

  return (
    <ul className="divide-y divide-surface-line">
      {rows.map(({ grant, siteName }) => (
        <li
          key={`${grant.role}:${grant.siteId ?? "network"}`}
          className="flex flex-col py-3 first:pt-0 last:pb-0 sm:flex-row sm:justify-between sm:gap-4"
        >
          <span className="font-semibold">{roleLabels[grant.role]}</span>
          <span className="text-ink-muted">{siteName}</span>
        </li>
      ))}
    </ul>
  );
}

export function AccountRoute() {
  const me = useSignedInPerson();

  return (
    <>
      <title>Account · Lintel</title>
      <h1 className="text-2xl font-bold tracking-tight md:text-3xl">Account</h1>

      <div className="mt-6 flex flex-col gap-6">
        <Card>
          <h2 className="text-lg font-semibold">Your details</h2>
          <dl className="mt-3 mb-5 grid gap-x-6 gap-y-3 sm:grid-cols-[max-content_1fr]">
            <dt className="text-sm font-semibold text-ink-muted sm:text-base">E-mail</dt>
            <dd className="-mt-2 break-all sm:mt-0">{me.user.email}</dd>
          </dl>
          <ProfileForm name={me.user.name} />
        </Card>

        <Card>
          <h2 className="mb-3 text-lg font-semibold">Your roles</h2>
          <RolesList grants={me.roles} />
        </Card>

        <Card>
          <h2 className="text-lg font-semibold">Password</h2>
          <p className="mt-1 mb-4 text-ink-muted">
            Changing your password signs you out on every other phone or computer.
          </p>
          <ChangePasswordForm email={me.user.email} />
        </Card>

        {canAnywhere(me.roles, "conduct:audit:site") ? (
          <OfflineStorageNote personId={me.user.id} />
        ) : null}

        <Card>
          <h2 className="text-lg font-semibold">Signing out</h2>
          <p className="mt-1 text-ink-muted">
            Sign out when you hand this device to someone else or leave it unattended.
          </p>
          <SignOutPanel />
        </Card>

        <CautionNote />
      </div>
    </>
  );
}
