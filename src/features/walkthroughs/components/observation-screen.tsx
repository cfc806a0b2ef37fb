import type { SequenceVersion } from "@shared/schemas/observations";
import { type ReactNode, useCallback } from "react";

import { Alert } from "@/components/ui/alert";
import { CautionNote } from "@/components/ui/caution-note";
import { Spinner } from "@/components/ui/spinner";

import { useLocalObservation } from "../hooks/use-local-observation";
import { auditDevice } from "../lib/audit-device";
import { type ObservationDraft, observationBody, outcomeOnPhone } from "../lib/observation-flow";
import {
  describeBreaches,
  observationOutcomeLabels,
  staffRoleLabels,
} from "@shared/observations/words";
import type { LocalObservation, QueuedChange } from "../lib/offline-store";
import { ObservationRecorder } from "./observation-recorder";

export interface ObservationScreenProps {
  observationId: string;
  sequences: readonly SequenceVersion[] | null;
  /** Links shown once it is finished: back to the space, observe again. */
  after: (observation: LocalObservation) => ReactNode;
}

/** Where the finished observation stands: on this phone only, refused, or arrived in Lintel. */
function SentState({
  observation,
  changes,
}: {
  observation: LocalObservation;
  changes: readonly QueuedChange[];
}) {
  const held = changes.find((change) => change.problem !== null);
  if (observation.state === "arrived" && observation.observation) {
    return (
      <Alert tone="success" title="Arrived in Lintel">
        <p>Lintel has recorded this observation once, under the id this phone gave it.</p>
      </Alert>
    );
  }
  if (held) {
    return (
      <Alert role="alert" tone="error" title="Not accepted by Lintel">
        <p>{held.problem!.message}</p>
      </Alert>
    );
  }
  return (
    <Alert tone="info" title="Saved on this phone only">
      <p>It is sent to Lintel by itself when there is signal; you can close this page.</p>
    </Alert>
  );
}

function FinishedObservation({
  observation,
  changes,
  after,
}: {
  observation: LocalObservation;
  changes: readonly QueuedChange[];
  after: ReactNode;
}) {
  const draft = observation.draft;
  const arrived = observation.observation;
  // Lintel decides the outcome; until it has answered, the phone decides it by the same rule.
  const result = arrived ?? outcomeOnPhone(draft);
  const outcome = result
    ? `${observationOutcomeLabels[result.outcome]}${
        result.breachCount > 0
          ? ` — ${describeBreaches(result.breachedSteps, result.breachCount)}`
          : ""
      }`
    : "";
  return (
    <div className="flex flex-col gap-4">
      <h2 className="text-xl font-bold">Observation finished</h2>
      <SentState observation={observation} changes={changes} />
      <dl className="grid grid-cols-[auto_1fr] gap-x-3 gap-y-1">
        <dt className="font-semibold">Sequence</dt>
        <dd>{draft.sequence?.title}</dd>
        <dt className="font-semibold">Observed</dt>
        <dd>
          {draft.staffCode} · {draft.staffRole ? staffRoleLabels[draft.staffRole] : ""}
        </dd>
        <dt className="font-semibold">Outcome</dt>
        <dd>{outcome}</dd>
        {result && result.handHygiene.expected > 0 ? (
          <>
            <dt className="font-semibold">Hand hygiene</dt>
            <dd>
              {result.handHygiene.performed} of {result.handHygiene.expected} moments performed
            </dd>
          </>
        ) : null}
        <dt className="font-semibold">Coaching</dt>
        <dd>{draft.coachingGiven ? "Given on the spot" : "Not given"}</dd>
      </dl>
      {after}
      <CautionNote />
    </div>
  );
}

/** An observation on this phone: recorded step by step, then shown as sent or waiting. */
export function ObservationScreen({ observationId, sequences, after }: ObservationScreenProps) {
  const state = useLocalObservation(observationId);
  const save = useCallback((draft: ObservationDraft) => {
    void auditDevice()
      .then(({ store, personId }) => store.saveObservationDraft(draft, personId, new Date()))
      .catch(() => undefined);
  }, []);
  const finish = useCallback(async (draft: ObservationDraft) => {
    const now = new Date();
    const body = observationBody(draft, now);
    if (!body) throw new Error("The observation is not complete.");
    const { store, personId } = await auditDevice();
    await store.saveObservationDraft(draft, personId, now);
    await store.finishObservation(draft.observationId, body, now);
  }, []);

  if (state.status === "loading") return <Spinner label="Opening the observation…" />;
  if (state.status === "absent") {
    return (
      <Alert role="alert" tone="error" title="Not on this phone">
        <p>
          This observation is not kept on this phone. Observations are kept only where they were
          recorded.
        </p>
      </Alert>
    );
  }
  const { observation, changes } = state;
  if (observation.state !== "recording") {
    return (
      <FinishedObservation observation={observation} changes={changes} after={after(observation)} />
    );
  }
  return (
    <ObservationRecorder
      initial={observation.draft}
      sequences={sequences}
      onSave={save}
      onFinish={finish}
    />
  );
}
