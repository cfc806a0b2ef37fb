import { type Role, roleLabels, roles } from "@shared/roles";
import type {
  PressureSettingsBody,
  PressureSettingsResponse,
} from "@shared/schemas/pressure-alarms";
import { type FormEvent, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { FieldError } from "@/components/ui/field";
import { Spinner, SpinnerGlyph } from "@/components/ui/spinner";
import { TextField } from "@/components/ui/text-field";
import { isApiError } from "@/lib/api-client";

import { usePressureSettings } from "../api/get-pressure-settings";
import { useUpdatePressureSettings } from "../api/update-pressure-settings";

interface Draft {
  graceSeconds: string;
  doorGraceSeconds: string;
  actionLimitMinutes: string;
  chosen: boolean;
  people: Set<string>;
}

const numberFields = [
  {
    name: "graceSeconds",
    label: "Grace, door shut (seconds)",
    defaultWords: "60 seconds",
  },
  {
    name: "doorGraceSeconds",
    label: "Grace while the door is open (seconds)",
    defaultWords: "300 seconds",
  },
  {
    name: "actionLimitMinutes",
    label: "Critical finding after (minutes)",
    defaultWords: "15 minutes",
  },
] as const;

function toDraft(settings: PressureSettingsResponse): Draft {
  return {
    graceSeconds: settings.graceSeconds === null ? "" : String(settings.graceSeconds),
    doorGraceSeconds: settings.doorGraceSeconds === null ? "" : String(settings.doorGraceSeconds),
    actionLimitMinutes:
      settings.actionLimitMinutes === null ? "" : String(settings.actionLimitMinutes),
    chosen: settings.recipients !== "default",
    people: new Set(
      settings.recipients === "default"
        ? settings.notified.map((person) => person.id)
        : settings.recipients,
    ),
  };
}

const roleWords = (names: readonly string[]) =>
  roles
    .filter((role) => names.includes(role))
    .map((role: Role) => roleLabels[role])
    .join(", ");

/** Empty means Lintel's default; anything else is sent as typed, for the server to judge. */
const asNumber = (value: string) => {
  const trimmed = value.trim();
  return (trimmed === "" ? null : Number.isNaN(Number(trimmed)) ? trimmed : Number(trimmed)) as
    number | null;
};

function EditSettings({
  siteId,
  settings,
}: {
  siteId: string;
  settings: PressureSettingsResponse;
}) {
  const [draft, setDraft] = useState<Draft>(() => toDraft(settings));
  const [saved, setSaved] = useState(false);
  const update = useUpdatePressureSettings(siteId);
  const error = update.error;
  const fieldError = (name: string) => (isApiError(error) ? error.fieldError(name) : undefined);
  const recipientError =
    fieldError("recipients") ??
    (isApiError(error)
      ? Object.entries(error.fields ?? {}).find(([key]) => key.startsWith("recipients."))?.[1]
      : undefined);
  const anyField =
    numberFields.some((field) => fieldError(field.name)) || recipientError !== undefined;

  const submit = (event: FormEvent) => {
    event.preventDefault();
    setSaved(false);
    const body: PressureSettingsBody = {
      graceSeconds: asNumber(draft.graceSeconds),
      doorGraceSeconds: asNumber(draft.doorGraceSeconds),
      actionLimitMinutes: asNumber(draft.actionLimitMinutes),
      recipients: draft.chosen
        ? settings.people.filter((person) => draft.people.has(person.id)).map((p) => p.id)
        : "default",
    };
    update.mutate(body, {
      onSuccess: (reply) => {
        setDraft(toDraft(reply));
        setSaved(true);
      },
    });
  };

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-4">
      <p className="text-ink-muted">
        A room whose monitor shows it not negative enough for longer than the grace raises an alarm,
        e-mailed once when it starts and once when it ends. While the door reports open the longer
        door grace applies. An alarm longer than the limit becomes a critical finding on the
        room&apos;s pressure item. Leave a box empty for Lintel&apos;s default (common practice, not
        a published rule).
      </p>
      <div className="grid gap-3 sm:grid-cols-3">
        {numberFields.map((field) => (
          <TextField
            key={field.name}
            label={field.label}
            inputMode="numeric"
            placeholder={`Default: ${field.defaultWords}`}
            value={draft[field.name]}
            onChange={(event) => {
              const value = event.target.value;
              setDraft((current) => ({ ...current, [field.name]: value }));
            }}
            error={fieldError(field.name)}
            hint={`Empty: ${field.defaultWords}`}
          />
        ))}
      </div>
      <fieldset className="flex flex-col gap-2">
        <legend className="mb-1 font-semibold">Who is told</legend>
        <label className="flex min-h-tap cursor-pointer items-center gap-3">
          <input
            type="radio"
            name="recipients"
            className="size-5 shrink-0 accent-brand-700"
            checked={!draft.chosen}
            onChange={() => setDraft((current) => ({ ...current, chosen: false }))}
          />
          <span>The site&apos;s facilities leads and auditors (the default)</span>
        </label>
        <label className="flex min-h-tap cursor-pointer items-center gap-3">
          <input
            type="radio"
            name="recipients"
            className="size-5 shrink-0 accent-brand-700"
            checked={draft.chosen}
            onChange={() => setDraft((current) => ({ ...current, chosen: true }))}
          />
          <span>People I choose</span>
        </label>
        {draft.chosen ? (
          <ul className="ml-8 flex flex-col gap-1" aria-label="People of this site">
            {settings.people.map((person) => (
              <li key={person.id}>
                <label className="flex min-h-tap cursor-pointer items-center gap-3">
                  <input
                    type="checkbox"
                    className="size-5 shrink-0 accent-brand-700"
                    checked={draft.people.has(person.id)}
                    onChange={(event) => {
                      const checked = event.target.checked;
                      setDraft((current) => {
                        const people = new Set(current.people);
                        if (checked) people.add(person.id);
                        else people.delete(person.id);
                        return { ...current, people };
                      });
                    }}
                  />
                  <span className="min-w-0 break-words">
                    {person.name}
                    <span className="block text-sm text-ink-muted">{roleWords(person.roles)}</span>
                  </span>
                </label>
              </li>
            ))}
          </ul>
        ) : (
          <p className="ml-8 text-sm text-ink-muted">
            {settings.notified.length === 0
              ? "No facilities lead or auditor holds a role here yet: nobody would be told."
              : `Told now: ${settings.notified.map((person) => person.name).join(", ")}.`}
          </p>
        )}
        {recipientError ? <FieldError>{recipientError}</FieldError> : null}
        {draft.chosen && draft.people.size === 0 ? (
          <p className="text-sm font-semibold">Nobody is chosen: alarms would e-mail no one.</p>
        ) : null}
      </fieldset>
      {error && !anyField ? (
        <Alert role="alert" tone="error">
          {isApiError(error) ? error.message : "The alarm settings could not be saved."}
        </Alert>
      ) : null}
      {saved ? (
        <Alert role="status" tone="success">
          The alarm settings are saved.
        </Alert>
      ) : null}
      <div className="flex flex-wrap gap-3">
        <Button type="submit" disabled={update.isPending}>
          {update.isPending ? <SpinnerGlyph /> : null}
          Save alarm settings
        </Button>
      </div>
      <p className="text-sm text-ink-muted">
        Lintel is not a life-safety alarm system and does not replace the building&apos;s own
        alarms.
      </p>
    </form>
  );
}

/** Administrators set the site's alarm graces, action limit and who is told. */
export function PressureSettingsForm({ siteId }: { siteId: string }) {
  const settings = usePressureSettings(siteId);
  if (settings.isPending) return <Spinner label="Loading alarm settings…" className="py-4" />;
  if (settings.isError)
    return (
      <Alert role="alert" tone="error" title="The alarm settings could not be loaded">
        <p>{settings.error.message}</p>
        <Button variant="secondary" className="mt-3" onClick={() => void settings.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  return <EditSettings siteId={siteId} settings={settings.data} />;
}
