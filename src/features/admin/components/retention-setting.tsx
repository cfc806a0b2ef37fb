import { useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { Card } from "@/components/ui/card";
import { Spinner, SpinnerGlyph } from "@/components/ui/spinner";
import { TextField } from "@/components/ui/text-field";

import { useObservationSettings } from "../api/get-observation-settings";
import { useSaveObservationSettings } from "../api/save-observation-settings";
import { readRetentionDays, retentionBounds, retentionText } from "../lib/sequence-form";
import { problemText } from "./editor-parts";

function RetentionForm({ savedDays }: { savedDays: number }) {
  const [value, setValue] = useState(String(savedDays));
  const [problem, setProblem] = useState<string | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const save = useSaveObservationSettings();

  return (
    <form
      noValidate
      className="flex flex-col gap-3"
      onSubmit={(event) => {
        event.preventDefault();
        setNotice(null);
        const read = readRetentionDays(value);
        if (!read.ok) {
          setProblem(read.message);
          return;
        }
        setProblem(null);
        save.mutate(
          { retentionDays: read.days },
          {
            onSuccess: (saved) =>
              setNotice(`Saved: observation detail is kept ${retentionText(saved.retentionDays)}.`),
          },
        );
      }}
    >
      <TextField
        label="Keep observation detail for (days)"
        hint={`Between ${retentionBounds.min} and ${retentionBounds.max.toLocaleString("en")} days; Lintel starts at ${retentionBounds.default} (two years). Now: ${retentionText(savedDays)}.`}
        inputMode="numeric"
        autoComplete="off"
        value={value}
        error={problem ?? undefined}
        onChange={(event) => setValue(event.target.value)}
      />
      {save.isError ? (
        <Alert role="alert" tone="error" title="Not saved">
          <p>{problemText(save.error)}</p>
        </Alert>
      ) : null}
      {notice ? (
        <Alert role="status" tone="success">
          {notice}
        </Alert>
      ) : null}
      <Button type="submit" className="self-start" disabled={save.isPending}>
        {save.isPending ? <SpinnerGlyph className="size-5" /> : null}
        Save retention period
      </Button>
    </form>
  );
}

/** How long the network keeps each observation's detail, and what goes and what stays. */
export function RetentionSetting() {
  const settings = useObservationSettings();
  return (
    <Card>
      <section aria-labelledby="observation-retention" className="flex flex-col gap-3">
        <h2 id="observation-retention" className="text-lg font-semibold">
          How long observation detail is kept
        </h2>
        <div className="flex max-w-prose flex-col gap-2 text-sm">
          <p>
            <span className="font-semibold">Removed</span> once an observation is older than this:
            the staff code of the person observed, each breach recorded with its note, the check of
            the area and the coaching note.
          </p>
          <p>
            <span className="font-semibold">Kept</span>: what the committee&apos;s figures count,
            which names no one: when and where the observation took place, the sequence, the
            person&apos;s role, its outcome, which steps had a breach and the hand-hygiene moments
            performed. Findings and corrective actions opened for a space stay as they are.
          </p>
        </div>
        {settings.isPending ? (
          <Spinner label="Loading the retention period…" className="py-4" />
        ) : settings.isError ? (
          <Alert role="alert" tone="error" title="We could not load the retention period">
            <p>{settings.error.message}</p>
            <Button variant="secondary" className="mt-3" onClick={() => void settings.refetch()}>
              Try again
            </Button>
          </Alert>
        ) : (
          <RetentionForm savedDays={settings.data.retentionDays} />
        )}
      </section>
    </Card>
  );
}
