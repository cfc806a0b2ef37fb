import { daysToClose, defaultDuePolicy, dueAt, isOverdue, type DuePolicy } from "@shared/calc/due";
import { polygonCentroid } from "@shared/calc/plan-geometry";
import { rolePermissions } from "@shared/permissions";
import { severities, type Severity } from "@shared/calc/verdict";
import type {
  ActionDetail,
  ActionListQuery,
  ActionSummary,
  DuePolicyResponse,
  TimelineEntry,
} from "@shared/schemas/actions";
import {
  actionMoves,
  moveAllowedFrom,
  moveTimelineKinds,
  stateOfLogEntry,
  systemMoves,
  timelineKindFromLog,
  wrongStateMessage,
  type ActionMoveName,
  type ActionState,
  type TimelineKind,
} from "@shared/workflow/action-workflow";

import { readTogether, type Database, type DbOrTx, type Tx } from "../../db/client";
import type { Env } from "../../env";
import { AppError, notFound } from "../../lib/app-error";
import { recordChange, type Actor } from "../../lib/change-log";
import { sha256Of, storeImage } from "../../lib/images";
import type { AppDeps, SignedIn } from "../../lib/context";
import { enqueueMail } from "../../outbox/outbox.repository";
import * as mails from "./actions.emails";
import * as repo from "./actions.repository";

const entity = "corrective_action";

const conflict = (message: string) => new AppError("conflict", 409, message);
const invalid = (field: string, message: string) =>
  new AppError("validation_failed", 400, message, { fields: { [field]: message } });

/** The move cannot be made from the action's state (shared/workflow/action-workflow.ts). */
function refuseUnlessAllowed(move: ActionMoveName, state: ActionState): void {
  if (!moveAllowedFrom(move, state)) throw conflict(wrongStateMessage(move, state));
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
    state: row.state,
    assignee: row.assigneeId ? { id: row.assigneeId, name: row.assigneeName ?? "" } : null,
    openedAt: row.openedAt.toISOString(),
    dueAt: row.dueAt.toISOString(),
    closedAt: row.closedAt?.toISOString() ?? null,
    daysToClose: row.daysToClose,
    closeReason: row.state === "done" ? (row.closeReason ?? "confirmed") : null,
    spaceRetiredAt: row.spaceRetiredAt?.toISOString() ?? null,
    overdue: isOverdue(row.dueAt, now, row.state === "done"),
    findingCount: row.findingCount,
    position: { x: row.x, y: row.y },
  };
}

/** Unfinished first, overdue first among them, then by due time. */
export function byUrgency(a: ActionSummary, b: ActionSummary): number {
  const rank = (action: ActionSummary) => (action.state === "done" ? 2 : action.overdue ? 0 : 1);
  return rank(a) - rank(b) || a.dueAt.localeCompare(b.dueAt);
}

export async function listActions(db: Database, siteId: string, query: ActionListQuery) {
  const now = new Date();
  return (await repo.listActions(db, siteId, query, now))
    .map((row) => toSummary(row, now))
    .sort(byUrgency);
}

/** What the person owns that is not done, overdue first. */
export async function myActions(db: Database, auth: SignedIn) {
  const now = new Date();
  return (await repo.actionsAssignedTo(db, auth.user.id))
    .filter((row) => auth.grants.some((g) => g.siteId === null || g.siteId === row.siteId))
    .map((row) => toSummary(row, now))
    .sort(byUrgency);
}

/**
 * Fixes waiting for a check at the sites where the person may confirm them: what the e-mail
 * asking for the check tells them, shown on their home page whether or not the e-mail arrived.
 */
export async function myChecks(db: Database, auth: SignedIn) {
  const now = new Date();
  const checking = auth.grants.filter((grant) =>
    rolePermissions[grant.role].includes(actionMoves.confirm.permission),
  );
  if (checking.length === 0) return [];
  const siteIds = checking.some((grant) => grant.siteId === null)
    ? null
    : checking.map((grant) => grant.siteId!);
  return (await repo.actionsToCheck(db, auth.user.networkId, siteIds))
    .map((row) => toSummary(row, now))
    .sort(byUrgency);
}

function timelineEntry(row: Awaited<ReturnType<typeof repo.timelineOf>>[number]): TimelineEntry {
  // Entries written before the states were renamed are translated here, never rewritten.
  const kind = timelineKindFromLog(row.action.replace(/^action\./, "")) ?? "opened";
  const after = (row.after ?? {}) as { assigneeName?: string };
  return {
    id: row.id,
    at: row.at.toISOString(),
    kind,
    actorName: row.actorName,
    fromState: stateOfLogEntry(row.before),
    toState: stateOfLogEntry(row.after),
    text:
      row.reason ??
      (kind === "assigned" && after.assigneeName ? `Now owned by ${after.assigneeName}.` : null),
  };
}

export async function actionDetail(db: DbOrTx, actionId: string): Promise<ActionDetail> {
  const row = await repo.findAction(db, actionId);
  if (!row) throw notFound("That corrective action");
  const [findingRows, proofRows, timelineRows, plan] = await readTogether(db, [
    () => repo.findingsOf(db, actionId),
    () => repo.proofsOf(db, actionId),
    () => repo.timelineOf(db, actionId),
    () => repo.planOf(db, row.floorId, row.spaceId),
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
 * A failure of an item that already has an unfinished action in this space joins that action; a
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
  const { queued } = await joinOrOpenActions(
    tx,
    env,
    { kind: "audit", ...audit },
    failed,
    actor,
    now,
  );
  return queued;
}

/**
 * The same path for what an observer saw of a space while watching PPE come off (no hand rub
 * within reach, a full bin, no clean/dirty separation): each item joins the item's unfinished
 * action in the space or opens one. The observation's breaches keep the link to the action, so no
 * audit finding row is written; the timeline says an observation found it, in Lintel's words
 * (never the observer's note, which is removed after the retention period while the change log
 * is kept). Returns the e-mails queued and the action of each item key.
 */
export async function recordObservationFindings(
  tx: Tx,
  env: Env,
  observation: { id: string; siteId: string; spaceId: string },
  failed: readonly FailedItem[],
  actor: Actor,
  now: Date,
): Promise<{ queued: number; actionIds: Map<string, string> }> {
  return joinOrOpenActions(tx, env, { kind: "observation", ...observation }, failed, actor, now);
}

/**
 * The same path for a room-pressure excursion past the site's action limit: a critical finding on
 * the room's pressure item that joins the item's unfinished action in the space or opens one. The
 * alarm keeps the link (`pressure_alarms.action_id`); no audit finding row is written.
 */
export async function recordPressureFinding(
  tx: Tx,
  env: Env,
  alarm: { id: string; siteId: string; spaceId: string },
  item: FailedItem,
  actor: Actor,
  now: Date,
): Promise<string | null> {
  const { actionIds } = await joinOrOpenActions(
    tx,
    env,
    { kind: "pressure", ...alarm },
    [item],
    actor,
    now,
  );
  return actionIds.get(item.key) ?? null;
}

type FindingSource = {
  kind: "audit" | "observation" | "pressure";
  id: string;
  siteId: string;
  spaceId: string;
};

async function joinOrOpenActions(
  tx: Tx,
  env: Env,
  source: FindingSource,
  failed: readonly FailedItem[],
  actor: Actor,
  now: Date,
): Promise<{ queued: number; actionIds: Map<string, string> }> {
  const actionIds = new Map<string, string>();
  if (failed.length === 0) return { queued: 0, actionIds };
  // Locked before reading, so a retirement of the space is either seen here or waits for this.
  await repo.lockSpaceForFindings(tx, source.spaceId);
  const space = await repo.spaceForFindings(tx, source.spaceId);
  if (!space) return { queued: 0, actionIds };
  const sourceFact =
    source.kind === "audit"
      ? { auditId: source.id }
      : source.kind === "observation"
        ? { observationId: source.id }
        : { pressureAlarmId: source.id };
  const policy = (await repo.duePolicyOf(tx, space.siteId)) ?? defaultDuePolicy;
  const [lead] = await repo.peopleWithRoleAt(tx, space.siteId, "facilities_lead");
  const position = polygonCentroid(space.polygon);
  let queued = 0;

  for (const item of failed) {
    // Only an unfinished action is found: systemMoves.joinsExisting.
    const existing = await repo.findUnfinishedAction(tx, space.id, item.key);
    const due = dueAt(now, item.severity, policy, space.timeZone);
    if (existing) {
      actionIds.set(item.key, existing.id);
      if (source.kind === "audit") {
        const finding = await repo.insertFinding(tx, {
          actionId: existing.id,
          auditId: source.id,
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
      }
      const changes: Partial<typeof existing> = {};
      // A graver failure tightens the action; a lighter one never loosens it.
      if (severityRank(item.severity) < severityRank(existing.severity)) {
        changes.severity = item.severity;
        if (due < existing.dueAt) changes.dueAt = due;
      }
      // Failing again while the fix waits for its check means the fix did not hold.
      const repeat = systemMoves.repeatFailure(existing.state);
      if (repeat.to !== existing.state) changes.state = repeat.to;
      if (repeat.newAttempt) changes.proofRound = existing.proofRound + 1;
      if (Object.keys(changes).length > 0) await repo.updateAction(tx, existing.id, changes);
      await logMove(tx, actor, { id: existing.id, siteId: space.siteId }, "finding_added", {
        before: { state: existing.state },
        after: { state: repeat.to, ...sourceFact },
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
      state: "to_fix",
      assigneeId: lead?.id ?? null,
      openedAt: now,
      dueAt: due,
      ...position,
    });
    actionIds.set(item.key, action.id);
    if (source.kind === "audit")
      await repo.insertFinding(tx, {
        actionId: action.id,
        auditId: source.id,
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
        state: "to_fix",
        ...sourceFact,
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
          source.kind,
        ),
        lead,
      );
      queued += 1;
    }
  }
  // An audit started before its space was retired still counts, but what it found is not work
  // for anyone now: its actions close at once, for the same reason as the space's others.
  if (space.retiredAt) await closeUnfinishedActions(tx, actor, [space.id], now);
  return { queued, actionIds };
}

const spaceRetiredWords = "Done because the space was retired; not counted as fixed.";
const spaceRestoredWords = "Back in the work list because the space was restored.";

async function closeUnfinishedActions(
  tx: Tx,
  actor: Actor,
  spaceIds: readonly string[],
  at: Date,
): Promise<number> {
  const actions = await repo.lockUnfinishedActionsOf(tx, spaceIds);
  for (const action of actions) {
    const to = systemMoves.retire(action.state);
    if (!to) continue;
    await repo.updateAction(tx, action.id, {
      state: to,
      closedAt: at,
      closeReason: "space_retired",
      daysToClose: null,
    });
    await logMove(tx, actor, action, "space_retired", {
      before: { state: action.state },
      after: { state: to, closeReason: "space_retired" },
      reason: spaceRetiredWords,
    });
  }
  return actions.length;
}

/**
 * Closes the unfinished actions of spaces being retired, inside the retirement's transaction, with
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
  return closeUnfinishedActions(tx, actor, spaceIds, at);
}

/**
 * Undoes what a retirement at `retiredAt` did to the spaces' actions: each it closed goes back to
 * the state it had, unless a newer action already follows the same item in that space.
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
    if (await repo.newerUnfinishedTwin(tx, action)) continue;
    const state = systemMoves.restore(await repo.stateBeforeRetirement(tx, action.id));
    await repo.updateAction(tx, action.id, {
      state,
      closedAt: null,
      closeReason: null,
      daysToClose: null,
    });
    await logMove(tx, actor, action, "space_restored", {
      before: { state: action.state, closeReason: "space_retired" },
      after: { state },
      reason: spaceRestoredWords,
    });
    reopened += 1;
  }
  return reopened;
}

/** How many actions follow the spaces; any at all is history a delete must not remove. */
export const countActionsOfSpaces = (db: DbOrTx, spaceIds: readonly string[]) =>
  repo.countActionsOfSpaces(db, spaceIds);

/** Loads and locks the action for a move, checking the workflow allows the move from its state. */
async function lockFor(tx: Tx, actionId: string, move: ActionMoveName) {
  const action = await repo.lockAction(tx, actionId);
  if (!action) throw notFound("That corrective action");
  refuseUnlessAllowed(move, action.state);
  return action;
}

interface Move {
  deps: AppDeps;
  auth: SignedIn;
  /** Who makes the move, for the timeline: the same person as `auth`, and the request. */
  actor: Actor;
  actionId: string;
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

async function finish(move: Move, queued: number): Promise<ActionDetail> {
  if (queued > 0) move.deps.notifyOutbox();
  return actionDetail(move.deps.db, move.actionId);
}

type LockedAction = NonNullable<Awaited<ReturnType<typeof repo.lockAction>>>;

/**
 * Makes a person's move that changes the state, as the workflow table says: to its state, with a
 * new attempt when the move starts one, logged with the note or reason it needed.
 */
async function changeState(
  tx: Tx,
  move: Move,
  name: Exclude<ActionMoveName, "add_photo" | "assign">,
  action: LockedAction,
  extra: { changes?: Partial<LockedAction>; before?: object; after?: object; reason?: string },
) {
  const rule = actionMoves[name];
  await repo.updateAction(tx, action.id, {
    state: rule.to,
    ...(rule.newAttempt ? { proofRound: action.proofRound + 1 } : {}),
    ...extra.changes,
  });
  await logMove(tx, move.actor, action, moveTimelineKinds[name], {
    before: { state: action.state, ...extra.before },
    after: { state: rule.to, ...extra.after },
    reason: extra.reason ?? null,
  });
}

/** The owner starts on the fix. */
export async function startAction(move: Move): Promise<ActionDetail> {
  await move.deps.db.transaction(async (tx) => {
    const action = await lockFor(tx, move.actionId, "start");
    await changeState(tx, move, "start", action, {});
  });
  return finish(move, 0);
}

/** A photo of the fix; counts for the current attempt only. */
const proofIdInUse = () =>
  new AppError("conflict", 409, "That photo id is already used for another photo.", {
    fields: { id: "This photo id is already used for another photo; make a new one." },
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
  refuseUnlessAllowed("add_photo", current.state);
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
    refuseUnlessAllowed("add_photo", action.state);
    const proof = await repo.insertProof(tx, {
      id: input.id,
      actionId: action.id,
      imageId: image.id,
      round: action.proofRound,
      uploadedBy: move.auth.user.id,
    });
    // Another action's proof took the id a moment ago.
    if (!proof) throw proofIdInUse();
    await logMove(tx, move.actor, action, moveTimelineKinds.add_photo, {
      after: { state: action.state, proofId: proof.id, imageId: image.id },
    });
    return true;
  });
  return { created, detail: await finish(move, 0) };
}

/** Needs a photo of this attempt and a note; the site's auditors are asked to check. */
export async function askForCheck(move: Move, note: string): Promise<ActionDetail> {
  const queued = await move.deps.db.transaction(async (tx) => {
    const action = await lockFor(tx, move.actionId, "ask_check");
    if (
      actionMoves.ask_check.needsProofOfAttempt &&
      (await repo.countProofs(tx, action.id, action.proofRound)) === 0
    ) {
      throw invalid("proof", "Add at least one photo of the fix before asking for a check.");
    }
    await changeState(tx, move, "ask_check", action, { reason: note });
    const row = (await repo.findAction(tx, action.id))!;
    const auditors = await repo.peopleWithRoleAt(tx, action.siteId, "auditor");
    for (const auditor of auditors) {
      await enqueueMail(
        tx,
        mails.checkAskedMail(mailFacts(move.deps.env, row, auditor), move.auth.user.name, note),
        auditor,
      );
    }
    return auditors.length;
  });
  return finish(move, queued);
}

/** An auditor saw the fix: the action is done and its days to close are kept. */
export async function confirmFix(move: Move, note: string): Promise<ActionDetail> {
  await move.deps.db.transaction(async (tx) => {
    const action = await lockFor(tx, move.actionId, "confirm");
    const closedAt = new Date();
    const days = daysToClose(action.openedAt, closedAt);
    await changeState(tx, move, "confirm", action, {
      changes: { closedAt, closeReason: "confirmed", daysToClose: days },
      after: { daysToClose: days },
      reason: note,
    });
  });
  return finish(move, 0);
}

async function tellAssignee(
  tx: Tx,
  move: Move,
  actionId: string,
  build: (facts: mails.ActionMailFacts) => ReturnType<typeof mails.sentBackMail>,
): Promise<number> {
  const row = (await repo.findAction(tx, actionId))!;
  if (!row.assigneeId) return 0;
  const assignee = await repo.findPerson(tx, row.assigneeId);
  if (!assignee) return 0;
  await enqueueMail(tx, build(mailFacts(move.deps.env, row, assignee)), assignee);
  return 1;
}

/** The proof does not show a fix: back to its owner, a new photo needed. */
export async function sendBack(move: Move, reason: string): Promise<ActionDetail> {
  const queued = await move.deps.db.transaction(async (tx) => {
    const action = await lockFor(tx, move.actionId, "send_back");
    await changeState(tx, move, "send_back", action, { reason });
    return tellAssignee(tx, move, action.id, (facts) =>
      mails.sentBackMail(facts, move.auth.user.name, reason),
    );
  });
  return finish(move, queued);
}

/** A done action that did not hold: back to its owner, history and original due time kept. */
export async function reopenAction(move: Move, reason: string): Promise<ActionDetail> {
  const queued = await move.deps.db.transaction(async (tx) => {
    const action = await lockFor(tx, move.actionId, "reopen");
    if ((await repo.findAction(tx, action.id))?.spaceRetiredAt) {
      throw conflict(
        "This action's space is retired. An administrator can restore the space; the actions its retirement made Done then go back to where they were.",
      );
    }
    const twin = await repo.newerUnfinishedTwin(tx, action);
    if (twin) {
      throw conflict(
        "A newer action already follows this item in this space; add to that one instead.",
      );
    }
    await changeState(tx, move, "reopen", action, {
      changes: { closedAt: null, closeReason: null, daysToClose: null },
      before: { closedAt: action.closedAt?.toISOString() ?? null },
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
    refuseUnlessAllowed("assign", action.state);
    const leads = await repo.peopleWithRoleAt(tx, action.siteId, "facilities_lead");
    const assignee = leads.find((lead) => lead.id === assigneeId);
    if (!assignee) {
      throw invalid("assigneeId", "Choose an active facilities lead of this site.");
    }
    if (action.assigneeId === assigneeId) return 0;
    await repo.updateAction(tx, action.id, { assigneeId });
    await logMove(tx, move.actor, action, moveTimelineKinds.assign, {
      before: { state: action.state, assigneeId: action.assigneeId },
      after: { state: action.state, assigneeId, assigneeName: assignee.name },
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
