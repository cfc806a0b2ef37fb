import { spaceParamsSchema } from "@shared/schemas/floors";
import { observationParamsSchema } from "@shared/schemas/observations";
import { useQuery, useQueryClient } from "@tanstack/react-query";
import { useEffect, useState } from "react";
import { Link, useNavigate, useParams } from "react-router-dom";

import { Alert } from "@/components/ui/alert";
import { buttonStyles } from "@/components/ui/button";
import { Spinner } from "@/components/ui/spinner";
import { paths } from "@/config/paths";
import { sequencesQueryOptions } from "@/features/admin/api/get-sequences";
import { ObservationScreen } from "@/features/walkthroughs/components/observation-screen";
import { auditDevice, hasOfflineStorage } from "@/features/walkthroughs/lib/audit-device";
import { newObservationDraft } from "@/features/walkthroughs/lib/observation-flow";
import { canAnywhere } from "@/lib/authorization";
import { newDeviceId } from "@/lib/device-ids";

import { restoreKept } from "../kept-data";
import { usePersonIfKnown } from "./audit-person";
import { knownSpace } from "./known-space";
import { NotAvailable } from "./not-available";

const onlyAuditors =
  "Only auditors observe putting on and removal. If you need to, ask an administrator of your site for the auditor role.";

function StartObservationPage({ spaceId }: { spaceId: string }) {
  const me = usePersonIfKnown();
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const [problem, setProblem] = useState<string | null>(() =>
    hasOfflineStorage()
      ? null
      : "This browser cannot keep observations on the phone. Try another browser, or leave private browsing.",
  );
  const mayObserve = !me || canAnywhere(me.roles, "conduct:audit:site");

  useEffect(() => {
    if (!hasOfflineStorage() || !mayObserve) return;
    let live = true;
    void (async () => {
      await restoreKept(queryClient);
      const space = knownSpace(queryClient, spaceId);
      const { store, personId } = await auditDevice();
      const observerId = me?.user.id ?? personId;
      const open = (await store.observationsForSpace(spaceId)).find(
        (candidate) => candidate.state === "recording" && candidate.observerId === observerId,
      );
      const observationId = open?.observationId ?? newDeviceId();
      if (!open) {
        await store.saveObservationDraft(
          newObservationDraft({
            observationId,
            spaceId,
            spaceName: space?.name ?? null,
            zoneType: space?.zoneType ?? null,
          }),
          observerId,
          new Date(),
        );
      }
      if (live) void navigate(paths.observation.getHref(observationId), { replace: true });
    })().catch(() => {
      if (live) setProblem("The observation could not be kept on this phone. Try again.");
    });
    return () => {
      live = false;
    };
  }, [queryClient, spaceId, me, mayObserve, navigate]);

  if (!mayObserve) return <NotAvailable description={onlyAuditors} />;
  if (problem) {
    return (
      <Alert role="alert" tone="error" title="The observation did not start">
        <p>{problem}</p>
      </Alert>
    );
  }
  return <Spinner label="Starting the observation…" className="py-8" />;
}

/** Starts (or resumes) this person's observation of putting on or removal in a space. */
export function StartObservationRoute() {
  const parsed = spaceParamsSchema.safeParse(useParams());
  if (!parsed.success)
    return <NotAvailable description="This link does not name a space Lintel knows." />;
  return <StartObservationPage key={parsed.data.spaceId} spaceId={parsed.data.spaceId} />;
}

function ObservationPage({ observationId }: { observationId: string }) {
  const me = usePersonIfKnown();
  const sequences = useQuery({ ...sequencesQueryOptions(), retry: false });
  const [spaceName, setSpaceName] = useState<string | null>(null);
  const published =
    sequences.data?.sequences.flatMap((entry) => (entry.published ? [entry.published] : [])) ??
    null;

  useEffect(() => {
    let live = true;
    void auditDevice()
      .then(({ store }) => store.getObservation(observationId))
      .then((found) => {
        if (live && found) setSpaceName(found.draft.spaceName);
      })
      .catch(() => undefined);
    return () => {
      live = false;
    };
  }, [observationId]);

  if (me && !canAnywhere(me.roles, "conduct:audit:site"))
    return <NotAvailable description={onlyAuditors} />;
  return (
    <>
      <title>Observing putting on or removal · Lintel</title>
      <p className="text-sm font-semibold text-ink-muted">Observing putting on or removal</p>
      <h1 className="mb-4 text-2xl font-bold tracking-tight">{spaceName ?? "Observation"}</h1>
      <ObservationScreen
        observationId={observationId}
        sequences={published}
        after={(observation) => (
          <div className="flex flex-col gap-2">
            <Link
              to={paths.startObservation.getHref(observation.spaceId)}
              className={buttonStyles({ size: "lg" })}
            >
              Observe someone else here
            </Link>
            <Link to={paths.home.getHref()} className={buttonStyles({ variant: "secondary" })}>
              Back to my sites
            </Link>
          </div>
        )}
      />
    </>
  );
}

/** An observation kept on this phone: being recorded, or finished and sent (or waiting to be). */
export function ObservationRoute() {
  const parsed = observationParamsSchema.safeParse(useParams());
  if (!parsed.success)
    return <NotAvailable description="This link does not name an observation." />;
  return (
    <ObservationPage key={parsed.data.observationId} observationId={parsed.data.observationId} />
  );
}
