import { zodResolver } from "@hookform/resolvers/zod";
import { deactivateBodySchema, type Person } from "@shared/schemas/people";
import { useRef, useState } from "react";
import { useForm } from "react-hook-form";

import { Alert } from "@/components/ui/alert";
import { Button } from "@/components/ui/button";
import { ConfirmStep } from "@/components/ui/confirm-step";
import { SpinnerGlyph } from "@/components/ui/spinner";
import { TextAreaField } from "@/components/ui/text-area-field";
import { formatDateTime } from "@/lib/format";

import { useDeactivatePerson } from "../api/deactivate-person";
import { useReactivatePerson } from "../api/reactivate-person";

interface DeactivateStepProps {
  person: Person;
  deactivate: ReturnType<typeof useDeactivatePerson>;
}

function DeactivateStep({ person, deactivate }: DeactivateStepProps) {
  const trigger = useRef<HTMLButtonElement>(null);
  const [confirming, setConfirming] = useState(false);
  const {
    register,
    handleSubmit,
    reset,
    formState: { errors },
  } = useForm({ resolver: zodResolver(deactivateBodySchema), defaultValues: { reason: "" } });

  const submit = handleSubmit((body) => {
    deactivate.mutate(body.reason ? { reason: body.reason } : {});
  });

  return (
    <div className="flex flex-col gap-3">
      <Button
        ref={trigger}
        variant="secondary"
        className="self-start"
        aria-expanded={confirming}
        disabled={confirming}
        onClick={() => setConfirming(true)}
      >
        Deactivate
      </Button>
      {confirming ? (
        <ConfirmStep
          title={`Deactivate ${person.name}?`}
          confirmLabel="Deactivate and sign out"
          pending={deactivate.isPending}
          returnFocusRef={trigger}
          onCancel={() => {
            deactivate.reset();
            reset();
            setConfirming(false);
          }}
          onConfirm={() => void submit()}
        >
          <p>
            This signs {person.name} out on every device at once and stops them signing in. Their
            roles and the records they made stay as they are, and you can reactivate them later.
          </p>
          <TextAreaField
            label="Reason (optional)"
            hint="Kept in the change log, e.g. left the trust, or on long leave."
            error={errors.reason?.message}
            {...register("reason")}
          />
          {deactivate.isError ? (
            <Alert role="alert" tone="error" title="Could not deactivate">
              {deactivate.error.message}
            </Alert>
          ) : null}
        </ConfirmStep>
      ) : null}
    </div>
  );
}

function Reactivate({ reactivate }: { reactivate: ReturnType<typeof useReactivatePerson> }) {
  return (
    <div className="flex flex-col gap-3">
      {reactivate.isError ? (
        <Alert role="alert" tone="error" title="Could not reactivate">
          {reactivate.error.message}
        </Alert>
      ) : null}
      <Button
        variant="secondary"
        className="self-start"
        disabled={reactivate.isPending}
        aria-busy={reactivate.isPending || undefined}
        onClick={() => reactivate.mutate()}
      >
        {reactivate.isPending ? <SpinnerGlyph className="size-5" /> : null}
        Reactivate
      </Button>
    </div>
  );
}

export interface PersonAccessProps {
  person: Person;
  /** The signed-in person: nobody deactivates themselves. */
  isSelf: boolean;
}

export function PersonAccess({ person, isSelf }: PersonAccessProps) {
  // Held here, not in the step: the step closes as soon as the person reads as deactivated.
  const deactivate = useDeactivatePerson(person.id);
  const reactivate = useReactivatePerson(person.id);

  if (person.status === "deactivated") {
    return (
      <div className="flex flex-col gap-3">
        {deactivate.isSuccess ? (
          <Alert role="status" tone="success">
            {person.name} is deactivated and signed out everywhere.
          </Alert>
        ) : null}
        <p>
          {person.deactivatedAt
            ? `Deactivated on ${formatDateTime(person.deactivatedAt)}. `
            : "Deactivated. "}
          {person.name} cannot sign in. Reactivating lets them sign in again with the roles listed
          above.
        </p>
        <Reactivate reactivate={reactivate} />
      </div>
    );
  }

  if (isSelf) {
    return (
      <p className="text-ink-muted">
        This is your own account. Another administrator can deactivate it if that is ever needed.
      </p>
    );
  }

  return (
    <div className="flex flex-col gap-3">
      {reactivate.isSuccess ? (
        <Alert role="status" tone="success">
          {person.name} is active again and can sign in.
        </Alert>
      ) : null}
      <p className="text-ink-muted">
        Deactivate someone who no longer works here or should not sign in for now.
      </p>
      <DeactivateStep person={person} deactivate={deactivate} />
    </div>
  );
}
