import { zoneTypeParamsSchema } from "@shared/schemas/checklists";
import { zoneTypeLabels } from "@shared/zones";
import type { QueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { useSearchParams } from "react-router-dom";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Spinner } from "@/components/ui/spinner";
import { checklistsQueryOptions, useChecklists } from "@/features/admin/api/get-checklists";
import { ChecklistEditor } from "@/features/admin/components/checklist-editor";
import { ChecklistOverview } from "@/features/admin/components/checklist-overview";
import { formFromVersion } from "@/features/admin/lib/checklist-form";
import { useAuthorization } from "@/lib/authorization";

import { signedInPersonMay } from "../session";
import { NotAvailable } from "./not-available";

export function checklistsLoader(queryClient: QueryClient) {
  return async () => {
    if (await signedInPersonMay(queryClient, "manage:checklists:network")) {
      void queryClient.prefetchQuery(checklistsQueryOptions());
    }
    return null;
  };
}

function ChecklistsPage() {
  const checklists = useChecklists();
  const [searchParams, setSearchParams] = useSearchParams();
  const [notice, setNotice] = useState<string | null>(null);
  const editing = zoneTypeParamsSchema.safeParse({ zoneType: searchParams.get("edit") });

  if (checklists.isPending) return <Spinner label="Loading checklists…" className="py-8" />;
  if (checklists.isError) {
    return (
      <Alert role="alert" tone="error" title="We could not load the checklists">
        <p>{checklists.error.message}</p>
        <Button variant="secondary" className="mt-3" onClick={() => void checklists.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  }

  const entry = editing.success
    ? checklists.data.checklists.find((candidate) => candidate.zoneType === editing.data.zoneType)
    : undefined;

  if (entry) {
    const label = zoneTypeLabels[entry.zoneType];
    const nextVersion = entry.draft?.version ?? entry.published.version + 1;
    return (
      <>
        <title>{`${label} checklist · Lintel`}</title>
        <h1 className="text-2xl font-bold tracking-tight md:text-3xl">{label} checklist</h1>
        <p className="mt-1 mb-6 text-ink-muted">
          Draft of version {nextVersion}. Version {entry.published.version} stays in use until this
          one is published.
        </p>
        <ChecklistEditor
          key={`${entry.zoneType}-${entry.draft?.id ?? entry.published.id}`}
          zoneType={entry.zoneType}
          nextVersion={nextVersion}
          initialValues={formFromVersion(entry.draft ?? entry.published)}
          hasSavedDraft={entry.draft !== null}
          onDone={(message) => {
            setNotice(message);
            setSearchParams({});
          }}
          onCancel={() => setSearchParams({})}
        />
      </>
    );
  }

  return (
    <>
      <title>Checklists · Lintel</title>
      <h1 className="text-2xl font-bold tracking-tight md:text-3xl">Checklists</h1>
      <p className="mt-2 mb-6 text-ink-muted">
        One checklist per kind of space, used by every site in the network. Each audit keeps the
        version that was published when it started.
      </p>
      {notice ? (
        <Alert role="status" tone="success" className="mb-4">
          {notice}
        </Alert>
      ) : null}
      <ChecklistOverview
        checklists={checklists.data.checklists}
        onEdit={(zoneType) => {
          setNotice(null);
          setSearchParams({ edit: zoneType });
        }}
      />
    </>
  );
}

/** Network administrators shape the checklists every audit follows. */
export function ChecklistsRoute() {
  const { canAnywhere } = useAuthorization();
  if (!canAnywhere("manage:checklists:network")) return <NotAvailable />;
  return <ChecklistsPage />;
}
