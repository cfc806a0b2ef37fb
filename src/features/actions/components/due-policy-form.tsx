import { type DuePolicy, type DueUnit, defaultDuePolicy, maxDueAmount } from "@shared/calc/due";
import { type Severity, severities } from "@shared/calc/verdict";
import { type FormEvent, useState } from "react";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { SelectField } from "@/components/ui/select-field";
import { Spinner, SpinnerGlyph } from "@/components/ui/spinner";
import { TextField } from "@/components/ui/text-field";
import { isApiError } from "@/lib/api-client";

import { useDuePolicy } from "../api/get-due-policy";
import { useUpdateDuePolicy } from "../api/update-due-policy";
import { severityLabels } from "../lib/action-labels";
import { SeveritySymbol } from "./action-badges";

type Draft = Record<Severity, { amount: string; unit: DueUnit }>;

const unitOptions = [
  { value: "hours", label: "hours" },
  { value: "days", label: "days" },
];

function toDraft(policy: DuePolicy): Draft {
  const draft = {} as Draft;
  for (const severity of severities) {
    draft[severity] = {
      amount: String(policy[severity].amount),
      unit: policy[severity].unit,
    };
  }
  return draft;
}

function describeDefault(severity: Severity): string {
  const rule = defaultDuePolicy[severity];
  return `${rule.amount} ${rule.unit}`;
}

function EditPolicy({
  siteId,
  initial,
  isDefault,
}: {
  siteId: string;
  initial: DuePolicy;
  isDefault: boolean;
}) {
  const [draft, setDraft] = useState<Draft>(() => toDraft(initial));
  const [saved, setSaved] = useState(false);
  const update = useUpdateDuePolicy(siteId);
  const error = update.error;
  const fieldError = (name: string) => (isApiError(error) ? error.fieldError(name) : undefined);
  const anyField = severities.some(
    (severity) => fieldError(`${severity}.amount`) || fieldError(`${severity}.unit`),
  );

  const submit = (event: FormEvent) => {
    event.preventDefault();
    setSaved(false);
    const body = {} as DuePolicy;
    for (const severity of severities) {
      const amount = draft[severity].amount.trim();
      // Sent as typed so the server's message explains a slip beside the field.
      body[severity] = {
        amount: (amount === "" ? amount : Number(amount)) as number,
        unit: draft[severity].unit,
      };
    }
    update.mutate(body, { onSuccess: () => setSaved(true) });
  };

  return (
    <form noValidate onSubmit={submit} className="flex flex-col gap-4">
      <p className="text-ink-muted">
        How long a new corrective action has before it is due, by the severity of the failed item.
        The defaults, {describeDefault("critical")} for critical, {describeDefault("major")} for
        major and {describeDefault("minor")} for minor, are common practice rather than a published
        rule. Actions already open keep their due times.
      </p>
      <p className="text-sm">
        {isDefault ? "This site uses the defaults." : "This site has its own due times."}
      </p>
      {severities.map((severity) => (
        <fieldset
          key={severity}
          className="grid grid-cols-[1fr_1fr] items-start gap-3 sm:grid-cols-[10rem_8rem_8rem]"
        >
          <legend className="col-span-2 mb-1 flex items-center gap-2 font-semibold sm:col-span-1">
            <SeveritySymbol severity={severity} className="size-5" />
            {severityLabels[severity]}
          </legend>
          <TextField
            label={`${severityLabels[severity]}: due after`}
            inputMode="numeric"
            value={draft[severity].amount}
            onChange={(event) => {
              const amount = event.target.value;
              setDraft((current) => ({ ...current, [severity]: { ...current[severity], amount } }));
            }}
            error={fieldError(`${severity}.amount`)}
            hint={`1 to ${maxDueAmount[draft[severity].unit]}`}
          />
          <SelectField
            label={`${severityLabels[severity]}: unit`}
            options={unitOptions}
            value={draft[severity].unit}
            onChange={(event) => {
              const unit = event.target.value as DueUnit;
              setDraft((current) => ({ ...current, [severity]: { ...current[severity], unit } }));
            }}
            error={fieldError(`${severity}.unit`)}
          />
        </fieldset>
      ))}
      {error && !anyField ? (
        <Alert role="alert" tone="error">
          {isApiError(error) ? error.message : "The due times could not be saved."}
        </Alert>
      ) : null}
      {saved ? (
        <Alert role="status" tone="success">
          The due times are saved. New actions at this site follow them.
        </Alert>
      ) : null}
      <div className="flex flex-wrap gap-3">
        <Button type="submit" disabled={update.isPending}>
          {update.isPending ? <SpinnerGlyph /> : null}
          Save due times
        </Button>
        <Button
          variant="quiet"
          onClick={() => {
            setSaved(false);
            setDraft(toDraft(defaultDuePolicy));
          }}
        >
          Use the defaults
        </Button>
      </div>
    </form>
  );
}

/** Administrators set how long each severity has; the server checks every number. */
export function DuePolicyForm({ siteId }: { siteId: string }) {
  const policy = useDuePolicy(siteId);
  if (policy.isPending) return <Spinner label="Loading due times…" className="py-4" />;
  if (policy.isError) {
    return (
      <Alert role="alert" tone="error" title="The due times could not be loaded">
        <p>{policy.error.message}</p>
        <Button variant="secondary" className="mt-3" onClick={() => void policy.refetch()}>
          Try again
        </Button>
      </Alert>
    );
  }
  return (
    <EditPolicy siteId={siteId} initial={policy.data.policy} isDefault={policy.data.isDefault} />
  );
}
