import type { QueryClient } from "@tanstack/react-query";
import { useId } from "react";
import { Link } from "react-router-dom";

import { appConfigQueryOptions } from "@/features/admin/api/get-app-config";
import { useAuthorization } from "@/lib/authorization";

import { type AdminEntry, useAdminEntries } from "../navigation-items";
import { signedInPersonMay } from "../session";
import { NotAvailable } from "./not-available";
import { useSignedInPerson } from "./protected-layout";

export function adminLoader(queryClient: QueryClient) {
  return async () => {
    if (await signedInPersonMay(queryClient, "read:dev-mailbox:network"))
      void queryClient.prefetchQuery(appConfigQueryOptions());
    return null;
  };
}

function AdminLink({ entry }: { entry: AdminEntry }) {
  const id = useId();
  return (
    <li>
      <Link
        to={entry.to}
        aria-labelledby={`${id}-label`}
        aria-describedby={`${id}-description`}
        className="flex min-h-tap items-start gap-3 rounded-card border border-surface-line bg-surface p-4 shadow-sm hover:border-brand-600 md:p-5"
      >
        <span aria-hidden="true" className="mt-0.5 size-6 shrink-0 text-brand-700">
          {entry.icon}
        </span>
        <span className="min-w-0">
          <span id={`${id}-label`} className="block font-semibold text-brand-800">
            {entry.label}
          </span>
          <span id={`${id}-description`} className="mt-1 block text-sm text-ink-muted">
            {entry.description}
          </span>
        </span>
      </Link>
    </li>
  );
}

/** The administrator's rarer pages in one list: the phone's bottom bar has room for one entry. */
export function AdminRoute() {
  const me = useSignedInPerson();
  const { canAnywhere } = useAuthorization();
  const entries = useAdminEntries(me.roles);
  if (!canAnywhere("manage:people:site")) return <NotAvailable />;

  return (
    <>
      <title>Admin · Lintel</title>
      <h1 className="text-2xl font-bold tracking-tight md:text-3xl">Admin</h1>
      <p className="mt-2 text-ink-muted">The people, checklists and mail you look after.</p>
      <ul className="mt-6 flex flex-col gap-3">
        {entries.map((entry) => (
          <AdminLink key={entry.to} entry={entry} />
        ))}
      </ul>
    </>
  );
}
