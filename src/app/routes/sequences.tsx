import type { QueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { useSearchParams } from "react-router-dom";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Spinner } from "@/components/ui/spinner";
import { observationSettingsQueryOptions } from "@/features/admin/api/get-observation-settings";
import { sequencesQueryOptions, useSequences } from "@/features/admin/api/get-sequences";
import { RetentionSetting } from "@/features/admin/components/retention-setting";
import { SequenceEditor } from "@/features/admin/components/sequence-editor";
import { SequenceOverview } from "@/features/admin/components/sequence-overview";
import { formFromVersion, newSequenceForm } from "@/features/admin/lib/sequence-form";
import { useAuthorization } from "@/lib/authorization";

import { signedInPersonMay } from "../session";
import { NotAvailable } from "./not-available";

/** Who shapes the sequences: the same network administrators who shape the checklists. */
const permission = "manage:checklists:network";

export function sequencesLoader(queryClient: QueryClient) {
  return async () => {
    if (await signedInPersonMay(queryClient, permission)) {
      void queryClient.prefetchQuery(sequencesQueryOptions());
      void queryClient.prefetchQuery(observationSettingsQueryOptions());
    }
    return null;
  };
}

function SequencesPage() {
  const sequences = useSequences();
  const [searchParams, setSearchParams] = useSearchParams();
  const [notice, setNotice] = useState<string | null>(null);
  const editing = searchParams.get("edit");
  const creating = searchParams.get("new") !== null;

  if (sequences.isPending) return <Spinner label="Loading sequences…" className="py-8" />;
  if (sequences.isError) {
    return (
      <Alert role="alert" tone="error" title="We could not load the sequences">
        <p>{sequences.error.message}</p>
        <Button variant="secondary" className="mt-3" onClick={() => void sequences.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  }

  const entries = sequences.data.sequences;
  const entry = editing ? entries.find((candidate) => candidate.key === editing) : undefined;
  const base = entry ? (entry.draft ?? entry.published) : null;
  const done = (message: string) => {
    setNotice(message);
    setSearchParams({});
  };

  if (entry && base) {
    const nextVersion = entry.draft?.version ?? (entry.published?.version ?? 0) + 1;
    return (
      <>
        <title>{`${base.title} · Lintel`}</title>
        {/* Keyed: each of the page's screens has a heading of its own, not one reused. */}
        <h1 key="edit" className="text-2xl font-bold tracking-tight md:text-3xl">
          {base.title}
        </h1>
        <p className="mt-1 mb-6 text-ink-muted">
          {entry.published
            ? `Draft of version ${nextVersion}. Version ${entry.published.version} stays in use until this one is published.`
            : `Draft of version ${nextVersion}. Observers cannot choose this sequence until it is published.`}
        </p>
        <SequenceEditor
          key={`${entry.key}-${base.id}`}
          sequenceKey={entry.key}
          takenKeys={entries.map((candidate) => candidate.key)}
          nextVersion={nextVersion}
          initialValues={formFromVersion(base)}
          hasSavedDraft={entry.draft !== null}
          onDone={done}
          onCancel={() => setSearchParams({})}
        />
      </>
    );
  }

  if (creating) {
    return (
      <>
        <title>New sequence · Lintel</title>
        <h1 key="new" className="text-2xl font-bold tracking-tight md:text-3xl">
          New sequence
        </h1>
        <p className="mt-1 mb-6 text-ink-muted">
          Observers can choose it once its first version is published.
        </p>
        <SequenceEditor
          sequenceKey={null}
          takenKeys={entries.map((candidate) => candidate.key)}
          nextVersion={1}
          initialValues={newSequenceForm()}
          hasSavedDraft={false}
          onDone={done}
          onCancel={() => setSearchParams({})}
        />
      </>
    );
  }

  return (
    <>
      <title>Observation steps · Lintel</title>
      <h1 key="list" className="text-2xl font-bold tracking-tight md:text-3xl">
        Observation steps
      </h1>
      <p className="mt-2 mb-6 max-w-prose text-ink-muted">
        The putting-on and removal sequences an observer reads aloud, step by step, used by every
        site in the network. Each observation keeps the version it followed.
      </p>
      {notice ? (
        <Alert role="status" tone="success" className="mb-4">
          {notice}
        </Alert>
      ) : null}
      <SequenceOverview
        sequences={entries}
        onEdit={(key) => {
          setNotice(null);
          setSearchParams({ edit: key });
        }}
      />
      <Button
        variant="secondary"
        className="mt-4"
        onClick={() => {
          setNotice(null);
          setSearchParams({ new: "" });
        }}
      >
        New sequence
      </Button>
      <div className="mt-8">
        <RetentionSetting />
      </div>
    </>
  );
}

/** Network administrators shape the sequences observers follow and how long detail is kept. */
export function SequencesRoute() {
  const { canAnywhere } = useAuthorization();
  if (!canAnywhere(permission)) return <NotAvailable />;
  return <SequencesPage />;
}
