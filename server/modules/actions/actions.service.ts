import { daysToClose, defaultDuePolicy, dueAt, isOverdue, type DuePolicy } from "@shared/calc/due";
import { polygonCentroid } from "@shared/calc/plan-geometry";
import { rolePermissions } from "@shared/permissions";
import { severities, type Severity } from "@shared/calc/verdict";
import type {
  ActionDetail,
  ActionListQuery,
  ActionStatus,
  ActionSummary,
  DuePolicyResponse,
  TimelineEntry,
  TimelineKind,
} from "@shared/schemas/actions";
import { timelineKinds } from "@shared/schemas/actions";

import type { Database, DbOrTx, Tx } from "../../db/client";
import type { Env } from "../../env";
import { AppError, notFound } from "../../lib/app-error";
import { recordChange, type Actor } from "../../lib/change-log";
import { sha256Of, storeImage } from "../../lib/images";
import type { AppDeps, SignedIn } from "../../lib/routes";
import { enqueueMail } from "../../outbox/outbox.repository";
import * as mails from "./actions.emails";
import * as repo from "./actions.repository";

const entity = "corrective_action";

const conflict = (message: string) => new AppError("conflict", 409, message);
const invalid = (field: string, message: string) =>
  new AppError("validation_failed", 400, message, { fields: { [field]: message } });

const statusWords: Record<ActionStatus, string> = {
  open: "open",
  in_progress: "in progress",
  awaiting_verification: "awaiting verification",
  closed: "closed",
};

function wrongStatus(status: ActionStatus, needed: string): AppError {
  return conflict(`This action is ${statusWords[status]}; it must be ${needed} for that.`);
}

export const actionLink = (env: Env, actionId: string) =>
  new URL(`/actions/${actionId}`, env.publicUrl).toString();

export const siteOfAction = (db: Database, actionId: string) => repo.siteOfAction(db, actionId);

export function toSummary(row: repo.ActionRow, now = new Date()): ActionSummary {
  return {
    id: row.id,
    siteId: row.siteId,
    siteName: row.siteName,
    siteTimeZone: row.siteTimeZone,
    spaceId: row.spaceId,
    spaceName: row.spaceName,
    zoneType: row.zoneType,
    floorId: row.floorId,
    floorName: row.floorName,
    itemKey: row.itemKey,
    title: row.title,
    severity: row.severity,
    status: row.status,
    assignee: row.assigneeId ? { id: row.assigneeId, name: row.assigneeName ?? "" } : null,
    openedAt: row.openedAt.toISOString(),
    dueAt: row.dueAt.toISOString(),
    closedAt: row.closedAt?.toISOString() ?? null,
    daysToClose: row.daysToClose,
    closeReason: row.status === "closed" ? (row.closeReason ?? "verified") : null,
    spaceRetiredAt: row.spaceRetiredAt?.toISOString() ?? null,
    overdue: isOverdue(row.dueAt, now, row.status === "closed"),
    findingCount: row.findingCount,
    position: { x: row.x, y: row.y },
  };
}

/** Unclosed first, overdue first among them, then by due time. */
export function byUrgency(a: ActionSummary, b: ActionSummary): number {
  const rank = (action: ActionSummary) => (action.status === "closed" ? 2 : action.overdue ? 0 : 1);
  return rank(a) - rank(b) || a.dueAt.localeCompare(b.dueAt);
}

export async function listActions(db: Database, siteId: string, query: ActionListQuery) {
  const now = new Date();
  return (await repo.listActions(db, siteId, query, now))
    .map((row) => toSummary(row, now))
    .sort(byUrgency);
}

/** What the person owns and has not closed, overdue first. */
export async function myActions(db: Database, auth: SignedIn) {
  const now = new Date();
  return (await repo.actionsAssignedTo(db, auth.user.id))
    .filter((row) => auth.grants.some((g) => g.siteId === null || g.siteId === row.siteId))
    .map((row) => toSummary(row, now))
    .sort(byUrgency);
}

/**
 * Fixes sent for verification at the sites where the person may verify: what the verification
 * e-mail tells them, shown on their home page whether or not the e-mail arrived.
 */
export async function myVerifications(db: Database, auth: SignedIn) {
  const now = new Date();
  const verifying = auth.grants.filter((grant) =>
    rolePermissions[grant.role].includes("verify:action:site"),
  );
  if (verifying.length === 0) return [];
  const siteIds = verifying.some((grant) => grant.siteId === null)
    ? null
    : verifying.map((grant) => grant.siteId!);
  return (await repo.actionsAwaitingVerification(db, auth.user.networkId, siteIds))
    .map((row) => toSummary(row, now))
    .sort(byUrgency);
}

function timelineEntry(row: Awaited<ReturnType<typeof repo.timelineOf>>[number]): TimelineEntry {
  const kind = row.action.replace(/^action\./, "") as TimelineEntry["kind"];
  const before = (row.before ?? {}) as { status?: ActionStatus };
  const after = (row.after ?? {}) as { status?: ActionStatus; assigneeName?: string };
  return {
    id: row.id,
    at: row.at.toISOString(),
    kind: timelineKinds.includes(kind) ? kind : "opened",
    actorName: row.actorName,
    fromStatus: before.status ?? null,
    toStatus: after.status ?? null,
    text:
      row.reason ??
      (kind === "assigned" && after.assigneeName ? `Now owned by ${after.assigneeName}.` : null),
  };
}

export async function actionDetail(db: DbOrTx, actionId: string): Promise<ActionDetail> {
  const row = await repo.findAction(db, actionId);
  if (!row) throw notFound("That corrective action");
  const [findingRows, proofRows, timelineRows, plan] = await Promise.all([
    repo.findingsOf(db, actionId),
    repo.proofsOf(db, actionId),
    repo.timelineOf(db, actionId),
    repo.planOf(db, row.floorId, row.spaceId),
  ]);
  return {
    action: toSummary(row),
    findings: findingRows.map((finding) => ({
      id: finding.id,
      auditId: finding.auditId,
      auditedAt: (finding.auditedAt ?? row.openedAt).toISOString(),
      auditorName: finding.auditorName,
      itemText: finding.itemText,
      severity: finding.severity,
      note: finding.note,
      photos: finding.photos,
    })),
    proofs: proofRows.map((proof) => ({
      id: proof.id,
      imageId: proof.imageId,
      uploadedBy: proof.uploadedBy,
      createdAt: proof.createdAt.toISOString(),
      current: proof.round === row.proofRound,
    })),
    timeline: timelineRows.map(timelineEntry),
    plan:
      plan?.imageId && plan.width && plan.height
        ? {
            imageId: plan.imageId,
            width: plan.width,
            height: plan.height,
            spacePolygon: plan.spacePolygon,
          }
        : null,
  };
}

export async function sitePolicy(db: DbOrTx, siteId: string): Promise<DuePolicyResponse> {
  const policy = await repo.duePolicyOf(db, siteId);
  return { policy: policy ?? defaultDuePolicy, isDefault: policy === null };
}

export async function setSitePolicy(
  db: Database,
  siteId: string,
  policy: DuePolicy,
  actor: Actor,
): Promise<DuePolicyResponse> {
  await db.transaction(async (tx) => {
    const before = (await repo.duePolicyOf(tx, siteId)) ?? defaultDuePolicy;
    await repo.saveDuePolicy(tx, siteId, policy);
    await recordChange(tx, actor, {
      action: "site.due_policy_set",
      entity: "site",
      entityId: siteId,
      siteId,
      before,
      after: policy,
    });
  });
  // Existing actions keep the due time they were given; the policy applies to new ones.
  return sitePolicy(db, siteId);
}

type MailFactsRow = Pick<
  repo.ActionRow,
  "id" | "title" | "severity" | "spaceName" | "siteName" | "siteTimeZone" | "dueAt"
>;

export function mailFacts(env: Env, row: MailFactsRow, to: repo.Recipient): mails.ActionMailFacts {
  return {
    to: to.email,
    name: to.name,
    link: actionLink(env, row.id),
    title: row.title,
    severity: row.severity,
    spaceName: row.spaceName,
    siteName: row.siteName,
    dueAt: row.dueAt,
    timeZone: row.siteTimeZone,
  };
}

const severityRank = (severity: Severity) => severities.indexOf(severity);

export interface FailedItem {
  itemId: string;
  key: string;
  text: string;
  severity: Severity;
  note: string | null;
}

/**
 * Turns the failed items of a just-submitted audit into findings, inside the submit's transaction.
 * A failure of an item that already has an unclosed action in this space joins that action; a
 * new one opens an action owned by the site's facilities lead, due by the site's policy.
 * Returns how many e-mails were queued.
 */
export async function recordFindings(
  tx: Tx,
  env: Env,
  audit: { id: string; siteId: string; spaceId: string },
  failed: readonly FailedItem[],
  actor: Actor,
  now: Date,
): Promise<number> {
  if (failed.length === 0) return 0;
  // Locked before reading, so a retirement of the space is either seen here or waits for this.
  await repo.lockSpaceForFindings(tx, audit.spaceId);
  const space = await repo.spaceForFindings(tx, audit.spaceId);
  if (!space) return 0;
  const policy = (await repo.duePolicyOf(tx, space.siteId)) ?? defaultDuePolicy;
  const [lead] = await repo.peopleWithRoleAt(tx, space.siteId, "facilities_lead");
  const position = polygonCentroid(space.polygon);
  let queued = 0;

  for (const item of failed) {
    const existing = await repo.findUnclosedAction(tx, space.id, item.key);
    const due = dueAt(now, item.severity, policy, space.timeZone);
    if (existing) {
      const finding = await repo.insertFinding(tx, {
        actionId: existing.id,
        auditId: audit.id,
        siteId: space.siteId,
        spaceId: space.id,
        itemId: item.itemId,
        itemKey: item.key,
        itemText: item.text,
        severity: item.severity,
        note: item.note,
        ...position,
      });
      if (!finding) continue;
      const changes: Partial<typeof existing> = {};
      // A graver failure tightens the action; a lighter one never loosens it.
      if (severityRank(item.severity) < severityRank(existing.severity)) {
        changes.severity = item.severity;
        if (due < existing.dueAt) changes.dueAt = due;
      }
      // Failing again while the fix waits for verification means the fix did not hold.
      if (existing.status === "awaiting_verification") {
        changes.status = "in_progress";
        changes.proofRound = existing.proofRound + 1;
      }
      if (Object.keys(changes).length > 0) await repo.updateAction(tx, existing.id, changes);
      await logMove(tx, actor, { id: existing.id, siteId: space.siteId }, "finding_added", {
        before: { status: existing.status },
        after: { status: changes.status ?? existing.status, auditId: audit.id },
        reason: item.note,
      });
      continue;
    }

    const action = await repo.insertAction(tx, {
      siteId: space.siteId,
      spaceId: space.id,
      floorId: space.floorId,
      itemKey: item.key,
      title: item.text,
      severity: item.severity,
      status: "open",
      assigneeId: lead?.id ?? null,
      openedAt: now,
      dueAt: due,
      ...position,
    });
    await repo.insertFinding(tx, {
      actionId: action.id,
      auditId: audit.id,
      siteId: space.siteId,
      spaceId: space.id,
      itemId: item.itemId,
      itemKey: item.key,
      itemText: item.text,
      severity: item.severity,
      note: item.note,
      ...position,
    });
    await logMove(tx, actor, { id: action.id, siteId: space.siteId }, "opened", {
      after: {
        status: "open",
        auditId: audit.id,
        severity: item.severity,
        dueAt: due.toISOString(),
        assigneeId: lead?.id ?? null,
      },
      reason: item.note,
    });
    if (lead && !space.retiredAt) {
      await enqueueMail(
        tx,
        mails.assignedMail(
          mailFacts(
            env,
            {
              id: action.id,
              title: item.text,
              severity: item.severity,
              spaceName: space.name,
              siteName: space.siteName,
              siteTimeZone: space.timeZone,
              dueAt: due,
            },
            lead,
          ),
          null,
        ),
        lead,
      );
      queued += 1;
    }
  }
  // An audit started before its space was retired still counts, but what it found is not work
  // for anyone now: its actions close at once, for the same reason as the space's others.
  if (space.retiredAt) await closeUnclosedActions(tx, actor, [space.id], now);
  return queued;
}

const spaceRetiredWords = "Closed because the space was retired; not counted as fixed.";
const spaceRestoredWords = "Reopened because the space was restored.";

async function closeUnclosedActions(
  tx: Tx,
  actor: Actor,
  spaceIds: readonly string[],
  at: Date,
): Promise<number> {
  const actions = await repo.lockUnclosedActionsOf(tx, spaceIds);
  for (const action of actions) {
    await repo.updateAction(tx, action.id, {
      status: "closed",
      closedAt: at,
      closeReason: "space_retired",
      daysToClose: null,
    });
    await logMove(tx, actor, action, "space_retired", {
      before: { status: action.status },
      after: { status: "closed", closeReason: "space_retired" },
      reason: spaceRetiredWords,
    });
  }
  return actions.length;
}

/**
 * Closes the unclosed actions of spaces being retired, inside the retirement's transaction, with
 * the reason "space retired": they leave the work lists but never count as fixed. Takes each
 * space's findings lock first, so an audit submitted at the same moment cannot open one after.
 */
export async function closeActionsOfRetiredSpaces(
  tx: Tx,
  actor: Actor,
  spaceIds: readonly string[],
  at: Date,
): Promise<number> {
  for (const spaceId of [...spaceIds].sort()) await repo.lockSpaceForFindings(tx, spaceId);
  return closeUnclosedActions(tx, actor, spaceIds, at);
}

/**
 * Undoes what a retirement at `retiredAt` did to the spaces' actions: each it closed goes back to
 * the status it had, unless a newer action already follows the same item in that space.
 */
export async function reopenActionsOfRestoredSpaces(
  tx: Tx,
  actor: Actor,
  spaceIds: readonly string[],
  retiredAt: Date,
): Promise<number> {
  for (const spaceId of [...spaceIds].sort()) await repo.lockSpaceForFindings(tx, spaceId);
  const actions = await repo.lockActionsClosedByRetirement(tx, spaceIds, retiredAt);
  let reopened = 0;
  for (const action of actions) {
    if (await repo.newerUnclosedTwin(tx, action)) continue;
    const status = (await repo.statusBeforeRetirement(tx, action.id)) ?? "open";
    await repo.updateAction(tx, action.id, {
      status: status === "closed" ? "open" : status,
      closedAt: null,
      closeReason: null,
      daysToClose: null,
    });
    await logMove(tx, actor, action, "space_restored", {
      before: { status: "closed", closeReason: "space_retired" },
      after: { status },
      reason: spaceRestoredWords,
    });
    reopened += 1;
  }
  return reopened;
}

/** How many actions follow the spaces; any at all is history a delete must not remove. */
export const countActionsOfSpaces = (db: DbOrTx, spaceIds: readonly string[]) =>
  repo.countActionsOfSpaces(db, spaceIds);

/** Loads and locks the action for a move, checking it is in one of the allowed states. */
async function lockFor(tx: Tx, actionId: string, allowed: readonly ActionStatus[], needed: string) {
  const action = await repo.lockAction(tx, actionId);
  if (!action) throw notFound("That corrective action");
  if (!allowed.includes(action.status)) throw wrongStatus(action.status, needed);
  return action;
}

interface Move {
  deps: AppDeps;
  auth: SignedIn;
  actionId: string;
  requestId: string;
}

/** One move of an action into the change log, which is also the action's timeline. */
function logMove(
  tx: Tx,
  actor: Actor,
  action: { id: string; siteId: string },
  kind: TimelineKind,
  change: { before?: object; after: object; reason?: string | null },
) {
  return recordChange(tx, actor, {
    action: `action.${kind}`,
    entity,
    entityId: action.id,
    siteId: action.siteId,
    ...change,
  });
}

const actorOf = (move: Move): Actor => ({ userId: move.auth.user.id, requestId: move.requestId });

async function finish(move: Move, queued: number): Promise<ActionDetail> {
  if (queued > 0) move.deps.notifyOutbox();
  return actionDetail(move.deps.db, move.actionId);
}

/** The facilities lead starts the fix. */
export async function startAction(move: Move): Promise<ActionDetail> {
  await move.deps.db.transaction(async (tx) => {
    const action = await lockFor(tx, move.actionId, ["open"], "open");
    await repo.updateAction(tx, action.id, { status: "in_progress" });
    await logMove(tx, actorOf(move), action, "started", {
      before: { status: action.status },
      after: { status: "in_progress" },
    });
  });
  return finish(move, 0);
}

/** A photo of the fix; counts for the current attempt only. */
const proofIdInUse = () =>
  new AppError("conflict", 409, "That proof id is already used for another photo.", {
    fields: { id: "This proof id is already used for another photo; make a new one." },
  });

/**
 * The proof already stored under this id when the upload is the same one again (same action and
 * bytes), so a phone retrying after a lost reply stores it once; another upload under the id is
 * a 409. null when the id is new.
 */
async function storedProofFor(
  db: DbOrTx,
  actionId: string,
  upload: { id: string; sha256: string },
): Promise<{ id: string } | null> {
  const stored = await repo.findProof(db, upload.id);
  if (!stored) return null;
  if (stored.actionId !== actionId || stored.sha256 !== upload.sha256) throw proofIdInUse();
  return stored;
}

/** Adds a photo of the fix under the id the phone made; the same upload again adds nothing. */
export async function addProof(
  move: Move,
  input: { id: string; buffer: Buffer },
): Promise<{ created: boolean; detail: ActionDetail }> {
  const upload = { id: input.id, sha256: sha256Of(input.buffer) };
  if (await storedProofFor(move.deps.db, move.actionId, upload)) {
    return { created: false, detail: await finish(move, 0) };
  }
  const current = await repo.findAction(move.deps.db, move.actionId);
  if (!current) throw notFound("That corrective action");
  if (current.status !== "open" && current.status !== "in_progress")
    throw wrongStatus(current.status, "open or in progress");
  const image = await storeImage(move.deps, {
    siteId: current.siteId,
    uploadedBy: move.auth.user.id,
    buffer: input.buffer,
    field: "photo",
  });
  const created = await move.deps.db.transaction(async (tx) => {
    const action = await repo.lockAction(tx, move.actionId);
    if (!action) throw notFound("That corrective action");
    // The same upload, sent twice at once, waited here for the first one.
    if (await storedProofFor(tx, move.actionId, upload)) return false;
    if (action.status !== "open" && action.status !== "in_progress")
      throw wrongStatus(action.status, "open or in progress");
    const proof = await repo.insertProof(tx, {
      id: input.id,
      actionId: action.id,
      imageId: image.id,
      round: action.proofRound,
      uploadedBy: move.auth.user.id,
    });
    // Another action's proof took the id a moment ago.
    if (!proof) throw proofIdInUse();
    await logMove(tx, actorOf(move), action, "proof_added", {
      after: { status: action.status, proofId: proof.id, imageId: image.id },
    });
    return true;
  });
  return { created, detail: await finish(move, 0) };
}

/** Needs proof of this attempt and a note; the site's auditors are told. */
export async function sendForVerification(move: Move, note: string): Promise<ActionDetail> {
  const queued = await move.deps.db.transaction(async (tx) => {
    const action = await lockFor(tx, move.actionId, ["in_progress"], "in progress");
    if ((await repo.countProofs(tx, action.id, action.proofRound)) === 0) {
      throw invalid(
        "proof",
        "Attach at least one photo of the fix before sending it for verification.",
      );
    }
    await repo.updateAction(tx, action.id, { status: "awaiting_verification" });
    await logMove(tx, actorOf(move), action, "sent_for_verification", {
      before: { status: action.status },
      after: { status: "awaiting_verification" },
      reason: note,
    });
    const row = (await repo.findAction(tx, action.id))!;
    const auditors = await repo.peopleWithRoleAt(tx, action.siteId, "auditor");
    for (const auditor of auditors) {
      await enqueueMail(
        tx,
        mails.verificationRequestedMail(
          mailFacts(move.deps.env, row, auditor),
          move.auth.user.name,
          note,
        ),
        auditor,
      );
    }
    return auditors.length;
  });
  return finish(move, queued);
}

/** An auditor has seen the fix: the action closes and its days to close are kept. */
export async function verifyAction(move: Move, note: string): Promise<ActionDetail> {
  await move.deps.db.transaction(async (tx) => {
    const action = await lockFor(
      tx,
      move.actionId,
      ["awaiting_verification"],
      "awaiting verification",
    );
    const closedAt = new Date();
    const days = daysToClose(action.openedAt, closedAt);
    await repo.updateAction(tx, action.id, {
      status: "closed",
      closedAt,
      closeReason: "verified",
      daysToClose: days,
    });
    await logMove(tx, actorOf(move), action, "verified", {
      before: { status: action.status },
      after: { status: "closed", daysToClose: days },
      reason: note,
    });
  });
  return finish(move, 0);
}

async function tellAssignee(
  tx: Tx,
  move: Move,
  actionId: string,
  build: (facts: mails.ActionMailFacts) => ReturnType<typeof mails.rejectedMail>,
): Promise<number> {
  const row = (await repo.findAction(tx, actionId))!;
  if (!row.assigneeId) return 0;
  const assignee = await repo.findPerson(tx, row.assigneeId);
  if (!assignee) return 0;
  await enqueueMail(tx, build(mailFacts(move.deps.env, row, assignee)), assignee);
  return 1;
}

/** The proof does not show a fix: back to in progress, new proof needed. */
export async function rejectAction(move: Move, reason: string): Promise<ActionDetail> {
  const queued = await move.deps.db.transaction(async (tx) => {
    const action = await lockFor(
      tx,
      move.actionId,
      ["awaiting_verification"],
      "awaiting verification",
    );
    await repo.updateAction(tx, action.id, {
      status: "in_progress",
      proofRound: action.proofRound + 1,
    });
    await logMove(tx, actorOf(move), action, "rejected", {
      before: { status: action.status },
      after: { status: "in_progress" },
      reason,
    });
    return tellAssignee(tx, move, action.id, (facts) =>
      mails.rejectedMail(facts, move.auth.user.name, reason),
    );
  });
  return finish(move, queued);
}

/** A closed action that did not hold: back to in progress, history and original due time kept. */
export async function reopenAction(move: Move, reason: string): Promise<ActionDetail> {
  const queued = await move.deps.db.transaction(async (tx) => {
    const action = await lockFor(tx, move.actionId, ["closed"], "closed");
    if ((await repo.findAction(tx, action.id))?.spaceRetiredAt) {
      throw conflict(
        "This action's space is retired. An administrator can restore the space; its actions closed by the retirement then reopen.",
      );
    }
    const twin = await repo.newerUnclosedTwin(tx, action);
    if (twin) {
      throw conflict(
        "A newer action already follows this item in this space; add to that one instead.",
      );
    }
    await repo.updateAction(tx, action.id, {
      status: "in_progress",
      closedAt: null,
      closeReason: null,
      daysToClose: null,
      proofRound: action.proofRound + 1,
    });
    await logMove(tx, actorOf(move), action, "reopened", {
      before: { status: action.status, closedAt: action.closedAt?.toISOString() ?? null },
      after: { status: "in_progress" },
      reason,
    });
    return tellAssignee(tx, move, action.id, (facts) =>
      mails.reopenedMail(facts, move.auth.user.name, reason),
    );
  });
  return finish(move, queued);
}

/** Hands the action to another facilities lead of the site, who is told. */
export async function assignAction(move: Move, assigneeId: string): Promise<ActionDetail> {
  const queued = await move.deps.db.transaction(async (tx) => {
    const action = await repo.lockAction(tx, move.actionId);
    if (!action) throw notFound("That corrective action");
    if (action.status === "closed")
      throw conflict("A closed action keeps the owner who closed it.");
    const leads = await repo.peopleWithRoleAt(tx, action.siteId, "facilities_lead");
    const assignee = leads.find((lead) => lead.id === assigneeId);
    if (!assignee) {
      throw invalid("assigneeId", "Choose an active facilities lead of this site.");
    }
    if (action.assigneeId === assigneeId) return 0;
    await repo.updateAction(tx, action.id, { assigneeId });
    await logMove(tx, actorOf(move), action, "assigned", {
      before: { status: action.status, assigneeId: action.assigneeId },
      after: { status: action.status, assigneeId, assigneeName: assignee.name },
    });
    const row = (await repo.findAction(tx, action.id))!;
    await enqueueMail(
      tx,
      mails.assignedMail(mailFacts(move.deps.env, row, assignee), move.auth.user.name),
      assignee,
    );
    return 1;
  });
  return finish(move, queued);
}

export async function assigneeOptions(db: Database, siteId: string) {
  const leads = await repo.peopleWithRoleAt(db, siteId, "facilities_lead");
  return leads.map(({ id, name }) => ({ id, name }));
}
