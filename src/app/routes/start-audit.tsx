import type { AuditDetail } from "@shared/schemas/audits";
import type { ChecklistsResponse } from "@shared/schemas/checklists";
import { spaceParamsSchema } from "@shared/schemas/floors";
import { onlineManager, type QueryClient, useQueryClient } from "@tanstack/react-query";
import { useCallback, useEffect, useState } from "react";
import { Link, useLocation, useNavigate, useParams } from "react-router-dom";

import { Button, buttonStyles } from "@/components/ui/button";
import { Spinner } from "@/components/ui/spinner";

import { paths } from "@/config/paths";
import { checklistsQueryOptions } from "@/features/admin/api/get-checklists";
import { meQueryOptions } from "@/features/auth/api/get-me";
import {
  cachedSpace,
  cachedSpaceName,
  floorOfSpaceQueryOptions,
} from "@/features/floor-plans/api/get-floor";
import { scheduledSpaceName } from "@/features/walkthroughs/api/get-site-schedule";
import { StartAudit } from "@/features/walkthroughs/components/start-audit";
import { isObservedZone } from "@/features/walkthroughs/lib/observation-flow";
import { prepareAuditDetail } from "@/features/walkthroughs/lib/prepared-audit";
import { canAnywhere } from "@/lib/authorization";

import { restoreKept } from "../kept-data";
import { usePersonIfKnown } from "./audit-person";
import { knownSpace } from "./known-space";
import { NotAvailable } from "./not-available";

/** The space's name from whatever list the auditor came from: the due list or a floor. */
function knownSpaceName(queryClient: QueryClient, spaceId: string): string | null {
  return scheduledSpaceName(queryClient, spaceId) ?? cachedSpaceName(queryClient, spaceId);
}

const freshChecklistWaitMs = 3_000;
/** A copy Lintel sent this recently counts as fresh (one asked for as the app started, say). */
const justSentMs = 10_000;

/** Resolves with undefined when Lintel takes longer than the phone should wait. */
const withinWait = <T,>(answer: Promise<T>): Promise<T | undefined> =>
  Promise.race([
    answer,
    new Promise<undefined>((resolve) => setTimeout(() => resolve(undefined), freshChecklistWaitMs)),
  ]).catch(() => undefined);

/** The published checklists: fresh when Lintel answers quickly, else as the phone keeps them. */
async function checklistsNow(queryClient: QueryClient): Promise<ChecklistsResponse | undefined> {
  const kept = () => queryClient.getQueryData(checklistsQueryOptions().queryKey);
  if (!onlineManager.isOnline()) return kept();
  const fresh = queryClient.fetchQuery({
    ...checklistsQueryOptions(),
    staleTime: justSentMs,
    retry: false,
  });
  return (await withinWait(fresh)) ?? kept();
}

/**
 * The space with its floor: as the phone keeps it, or else (a QR code opened before any list)
 * from Lintel when it answers quickly, so the audit starts from it rather than waiting on Lintel
 * to start the audit itself.
 */
async function spaceNow(queryClient: QueryClient, spaceId: string) {
  const kept = cachedSpace(queryClient, spaceId);
  if (kept || !onlineManager.isOnline()) return kept;
  await withinWait(
    queryClient.fetchQuery({ ...floorOfSpaceQueryOptions(queryClient, spaceId), retry: false }),
  );
  return cachedSpace(queryClient, spaceId);
}

/**
 * The audit built on the phone from what it keeps (the space from its floor, the published
 * checklist of its zone type), so it starts at once, with or without signal. Null when something
 * is not kept: the audit then waits for Lintel to send its checklist.
 */
async function preparedAudit(
  queryClient: QueryClient,
  spaceId: string,
  auditId: string,
  now: Date,
): Promise<AuditDetail | null> {
  await restoreKept(queryClient);
  // Asked as the app started; on a cold phone its answer may still be on the way.
  const me =
    queryClient.getQueryData(meQueryOptions().queryKey) ??
    (onlineManager.isOnline()
      ? await withinWait(queryClient.ensureQueryData(meQueryOptions()))
      : undefined);
  if (!me) return null;
  const [found, checklists] = await Promise.all([
    spaceNow(queryClient, spaceId),
    checklistsNow(queryClient),
  ]);
  if (!found) return null;
  const checklist = checklists?.checklists.find(
    (entry) => entry.zoneType === found.space.zoneType,
  )?.published;
  if (!checklist) return null;
  return prepareAuditDetail({
    auditId,
    space: { ...found.space, siteId: found.floor.siteId },
    checklist,
    auditor: { id: me.user.id, name: me.user.name },
    startedAt: now,
  });
}

function StartAuditPage({ spaceId }: { spaceId: string }) {
  const me = usePersonIfKnown();
  const queryClient = useQueryClient();
  const navigate = useNavigate();
  const [spaceName] = useState(() => knownSpaceName(queryClient, spaceId));
  const prepare = useCallback(
    (auditId: string, now: Date) => preparedAudit(queryClient, spaceId, auditId, now),
    [queryClient, spaceId],
  );
  const onReady = useCallback(
    (auditId: string) => void navigate(paths.audit.getHref(auditId), { replace: true }),
    [navigate],
  );

  if (me && !canAnywhere(me.roles, "conduct:audit:site")) {
    return (
      <NotAvailable description="Only auditors start audits. If you need to, ask an administrator of your site for the auditor role." />
    );
  }
  return (
    <>
      <title>Starting an audit · Lintel</title>
      {spaceName ? <h1 className="mb-4 text-2xl font-bold tracking-tight">{spaceName}</h1> : null}
      <StartAudit
        spaceId={spaceId}
        spaceName={spaceName}
        personId={me?.user.id ?? null}
        prepare={prepare}
        onReady={onReady}
      />
    </>
  );
}

type Choice = "deciding" | "ask" | "audit";

/**
 * Opened from outside the app (a scanned QR code) at a donning zone, doffing area or anteroom:
 * the auditor chooses between auditing the space and observing someone put on or remove PPE.
 * From Lintel's own lists the audit starts at once (they have their own "Observe" link).
 */
function useChoice(spaceId: string): [Choice, () => void, string | null] {
  const queryClient = useQueryClient();
  const openedFromOutside = useLocation().key === "default";
  const [choice, setChoice] = useState<Choice>(openedFromOutside ? "deciding" : "audit");
  const [name, setName] = useState<string | null>(null);
  useEffect(() => {
    if (choice !== "deciding") return;
    let live = true;
    void restoreKept(queryClient).then(async () => {
      // A phone that keeps nothing of the space asks Lintel (briefly), so the choice does not
      // depend on which answer came first.
      const found = knownSpace(queryClient, spaceId) ?? (await spaceNow(queryClient, spaceId));
      if (!live) return;
      const space =
        found && "space" in found
          ? { name: found.space.name, zoneType: found.space.zoneType }
          : found;
      setName(space?.name ?? null);
      setChoice(isObservedZone(space?.zoneType) ? "ask" : "audit");
    });
    return () => {
      live = false;
    };
  }, [choice, queryClient, spaceId]);
  return [choice, () => setChoice("audit"), name];
}

function AuditOrObserve({
  spaceId,
  spaceName,
  onAudit,
}: {
  spaceId: string;
  spaceName: string | null;
  onAudit: () => void;
}) {
  return (
    <>
      <title>What to do here · Lintel</title>
      <h1 className="mb-2 text-2xl font-bold tracking-tight">{spaceName ?? "This space"}</h1>
      <p className="mb-5">What are you here to do?</p>
      <div className="flex flex-col gap-3">
        <Button size="lg" className="min-h-16" onClick={onAudit}>
          Audit this space
        </Button>
        <Link
          to={paths.startObservation.getHref(spaceId)}
          replace
          className={buttonStyles({ size: "lg", variant: "secondary", className: "min-h-16" })}
        >
          Observe putting on or removal
        </Link>
      </div>
    </>
  );
}

function StartHere({ spaceId }: { spaceId: string }) {
  const [choice, audit, spaceName] = useChoice(spaceId);
  if (choice === "deciding") return <Spinner label="Opening the space…" className="py-8" />;
  if (choice === "ask")
    return <AuditOrObserve spaceId={spaceId} spaceName={spaceName} onAudit={audit} />;
  return <StartAuditPage spaceId={spaceId} />;
}

/**
 * Where a space's QR code leads: opens this person's draft for the space on this phone, or
 * starts a new audit — also without a connection. At a donning zone, doffing area or anteroom the
 * code first offers the choice to observe putting on or removal instead.
 */
export function StartAuditRoute() {
  const parsed = spaceParamsSchema.safeParse(useParams());
  if (!parsed.success)
    return <NotAvailable description="This QR code or link does not name a space Lintel knows." />;
  return <StartHere key={parsed.data.spaceId} spaceId={parsed.data.spaceId} />;
}
