import { aliasedTable, and, asc, count, desc, eq, inArray, isNull, ne, sql } from "drizzle-orm";

import type { DuePolicy } from "@shared/calc/due";
import type { Severity } from "@shared/calc/verdict";
import type { ActionListQuery } from "@shared/schemas/actions";
import {
  ownerWorkStates,
  stateOfLogEntry,
  type ActionCloseReason,
  type ActionState,
} from "@shared/workflow/action-workflow";

import type { DbOrTx } from "../../db/client";
import {
  actionNotices,
  actionProofs,
  auditPhotos,
  audits,
  changeLog,
  correctiveActions,
  findings,
  floors,
  images,
  roleGrants,
  siteDuePolicies,
  sites,
  spaces,
  users,
} from "../../db/schema/index";

const assignees = aliasedTable(users, "assignees");

const findingCounts = (db: DbOrTx) =>
  db
    .select({ actionId: findings.actionId, findingCount: count().as("finding_count") })
    .from(findings)
    .groupBy(findings.actionId)
    .as("finding_counts");

export interface ActionRow {
  id: string;
  siteId: string;
  siteName: string;
  siteTimeZone: string;
  spaceId: string;
  spaceName: string;
  zoneType: "isolation_room" | "anteroom" | "donning_zone" | "doffing_area";
  floorId: string;
  floorName: string;
  itemKey: string;
  title: string;
  severity: Severity;
  state: ActionState;
  assigneeId: string | null;
  assigneeName: string | null;
  openedAt: Date;
  dueAt: Date;
  closedAt: Date | null;
  daysToClose: number | null;
  closeReason: ActionCloseReason | null;
  spaceRetiredAt: Date | null;
  proofRound: number;
  x: number;
  y: number;
  findingCount: number;
}

function actionQuery(db: DbOrTx) {
  const counts = findingCounts(db);
  return db
    .select({
      id: correctiveActions.id,
      siteId: correctiveActions.siteId,
      siteName: sites.name,
      siteTimeZone: sites.timeZone,
      spaceId: correctiveActions.spaceId,
      spaceName: spaces.name,
      zoneType: spaces.zoneType,
      floorId: correctiveActions.floorId,
      floorName: floors.name,
      itemKey: correctiveActions.itemKey,
      title: correctiveActions.title,
      severity: correctiveActions.severity,
      state: correctiveActions.state,
      assigneeId: correctiveActions.assigneeId,
      assigneeName: assignees.displayName,
      openedAt: correctiveActions.openedAt,
      dueAt: correctiveActions.dueAt,
      closedAt: correctiveActions.closedAt,
      daysToClose: correctiveActions.daysToClose,
      closeReason: correctiveActions.closeReason,
      spaceRetiredAt: spaces.retiredAt,
      proofRound: correctiveActions.proofRound,
      x: correctiveActions.x,
      y: correctiveActions.y,
      findingCount: sql<number>`coalesce(${counts.findingCount}, 0)::int`,
    })
    .from(correctiveActions)
    .innerJoin(sites, eq(sites.id, correctiveActions.siteId))
    .innerJoin(spaces, eq(spaces.id, correctiveActions.spaceId))
    .innerJoin(floors, eq(floors.id, correctiveActions.floorId))
    .leftJoin(assignees, eq(assignees.id, correctiveActions.assigneeId))
    .leftJoin(counts, eq(counts.actionId, correctiveActions.id));
}

export async function findAction(db: DbOrTx, actionId: string): Promise<ActionRow | null> {
  const [row] = await actionQuery(db).where(eq(correctiveActions.id, actionId));
  return row ?? null;
}

export async function siteOfAction(db: DbOrTx, actionId: string): Promise<string | null> {
  const [row] = await db
    .select({ siteId: correctiveActions.siteId })
    .from(correctiveActions)
    .where(eq(correctiveActions.id, actionId));
  return row?.siteId ?? null;
}

export async function listActions(
  db: DbOrTx,
  siteId: string,
  filters: ActionListQuery,
  now: Date,
): Promise<ActionRow[]> {
  const conditions = [eq(correctiveActions.siteId, siteId)];
  if (filters.state === "unfinished") conditions.push(ne(correctiveActions.state, "done"));
  if (filters.state === "done") conditions.push(eq(correctiveActions.state, "done"));
  if (filters.floorId) conditions.push(eq(correctiveActions.floorId, filters.floorId));
  if (filters.spaceId) conditions.push(eq(correctiveActions.spaceId, filters.spaceId));
  if (filters.severity) conditions.push(eq(correctiveActions.severity, filters.severity));
  if (filters.overdue === "true") {
    conditions.push(ne(correctiveActions.state, "done"));
    conditions.push(sql`${correctiveActions.dueAt} < ${now}`);
  }
  return actionQuery(db)
    .where(and(...conditions))
    .orderBy(asc(correctiveActions.dueAt));
}

/** Unfinished actions assigned to the person, at sites of their network. */
export async function actionsAssignedTo(db: DbOrTx, userId: string): Promise<ActionRow[]> {
  return actionQuery(db)
    .where(and(eq(correctiveActions.assigneeId, userId), ne(correctiveActions.state, "done")))
    .orderBy(asc(correctiveActions.dueAt));
}

/** Fixes waiting for an auditor at the given sites (every site of the network when null). */
export async function actionsToCheck(
  db: DbOrTx,
  networkId: string,
  siteIds: string[] | null,
): Promise<ActionRow[]> {
  if (siteIds !== null && siteIds.length === 0) return [];
  const conditions = [eq(correctiveActions.state, "to_check"), eq(sites.networkId, networkId)];
  if (siteIds !== null) conditions.push(inArray(correctiveActions.siteId, siteIds));
  return actionQuery(db)
    .where(and(...conditions))
    .orderBy(asc(correctiveActions.dueAt));
}

export async function lockAction(db: DbOrTx, actionId: string) {
  const [row] = await db
    .select()
    .from(correctiveActions)
    .where(eq(correctiveActions.id, actionId))
    .for("update");
  return row ?? null;
}

export async function updateAction(
  db: DbOrTx,
  actionId: string,
  values: Partial<typeof correctiveActions.$inferInsert>,
) {
  await db
    .update(correctiveActions)
    .set({ ...values, updatedAt: new Date() })
    .where(eq(correctiveActions.id, actionId));
}

/** Serialises findings for one space, so two audits submitted at once cannot open twin actions. */
export async function lockSpaceForFindings(db: DbOrTx, spaceId: string) {
  await db.execute(sql`select pg_advisory_xact_lock(hashtext(${`findings:${spaceId}`}))`);
}

export async function findUnfinishedAction(db: DbOrTx, spaceId: string, itemKey: string) {
  const [row] = await db
    .select()
    .from(correctiveActions)
    .where(
      and(
        eq(correctiveActions.spaceId, spaceId),
        eq(correctiveActions.itemKey, itemKey),
        ne(correctiveActions.state, "done"),
      ),
    )
    .for("update");
  return row ?? null;
}

export async function insertAction(db: DbOrTx, values: typeof correctiveActions.$inferInsert) {
  const [row] = await db.insert(correctiveActions).values(values).returning();
  return row!;
}

export async function insertFinding(db: DbOrTx, values: typeof findings.$inferInsert) {
  const [row] = await db.insert(findings).values(values).onConflictDoNothing().returning();
  return row ?? null;
}

export async function findingsOf(db: DbOrTx, actionId: string) {
  const rows = await db
    .select({
      id: findings.id,
      auditId: findings.auditId,
      itemId: findings.itemId,
      auditedAt: audits.submittedAt,
      auditorName: users.displayName,
      itemText: findings.itemText,
      severity: findings.severity,
      note: findings.note,
    })
    .from(findings)
    .innerJoin(audits, eq(audits.id, findings.auditId))
    .innerJoin(users, eq(users.id, audits.auditorId))
    .where(eq(findings.actionId, actionId))
    .orderBy(desc(audits.submittedAt));
  if (rows.length === 0) return [];
  const photos = await db
    .select({
      auditId: auditPhotos.auditId,
      itemId: auditPhotos.itemId,
      imageId: auditPhotos.imageId,
    })
    .from(auditPhotos)
    .where(
      inArray(
        auditPhotos.auditId,
        rows.map((row) => row.auditId),
      ),
    )
    .orderBy(asc(auditPhotos.createdAt));
  return rows.map((row) => ({
    ...row,
    photos: photos
      .filter((photo) => photo.auditId === row.auditId && photo.itemId === row.itemId)
      .map((photo) => ({ imageId: photo.imageId })),
  }));
}

export async function proofsOf(db: DbOrTx, actionId: string) {
  return db
    .select({
      id: actionProofs.id,
      imageId: actionProofs.imageId,
      round: actionProofs.round,
      uploadedBy: users.displayName,
      createdAt: actionProofs.createdAt,
    })
    .from(actionProofs)
    .leftJoin(users, eq(users.id, actionProofs.uploadedBy))
    .where(eq(actionProofs.actionId, actionId))
    .orderBy(asc(actionProofs.createdAt));
}

export async function countProofs(db: DbOrTx, actionId: string, round: number) {
  const [row] = await db
    .select({ n: count() })
    .from(actionProofs)
    .where(and(eq(actionProofs.actionId, actionId), eq(actionProofs.round, round)));
  return row?.n ?? 0;
}

/** A stored proof with the SHA-256 of the bytes it was uploaded as. */
export async function findProof(db: DbOrTx, proofId: string) {
  const [row] = await db
    .select({ id: actionProofs.id, actionId: actionProofs.actionId, sha256: images.sha256 })
    .from(actionProofs)
    .innerJoin(images, eq(images.id, actionProofs.imageId))
    .where(eq(actionProofs.id, proofId));
  return row ?? null;
}

/** null when the id is taken (the same upload a moment ago, or another action's proof). */
export async function insertProof(db: DbOrTx, values: typeof actionProofs.$inferInsert) {
  const [row] = await db.insert(actionProofs).values(values).onConflictDoNothing().returning();
  return row ?? null;
}

/** The action's moves, oldest first, from the append-only change log. */
export async function timelineOf(db: DbOrTx, actionId: string) {
  return db
    .select({
      id: changeLog.id,
      at: changeLog.occurredAt,
      action: changeLog.action,
      actorName: users.displayName,
      before: changeLog.before,
      after: changeLog.after,
      reason: changeLog.reason,
    })
    .from(changeLog)
    .leftJoin(users, eq(users.id, changeLog.actorId))
    .where(and(eq(changeLog.entity, "corrective_action"), eq(changeLog.entityId, actionId)))
    .orderBy(asc(changeLog.occurredAt), asc(changeLog.id));
}

export async function planOf(db: DbOrTx, floorId: string, spaceId: string) {
  const [row] = await db
    .select({
      imageId: floors.planImageId,
      width: floors.planWidth,
      height: floors.planHeight,
      spacePolygon: spaces.polygon,
    })
    .from(floors)
    .innerJoin(spaces, eq(spaces.id, spaceId))
    .where(eq(floors.id, floorId));
  return row ?? null;
}

export async function spaceForFindings(db: DbOrTx, spaceId: string) {
  const [row] = await db
    .select({
      id: spaces.id,
      siteId: spaces.siteId,
      floorId: spaces.floorId,
      name: spaces.name,
      polygon: spaces.polygon,
      timeZone: sites.timeZone,
      siteName: sites.name,
      retiredAt: spaces.retiredAt,
    })
    .from(spaces)
    .innerJoin(sites, eq(sites.id, spaces.siteId))
    .where(eq(spaces.id, spaceId));
  return row ?? null;
}

export async function duePolicyOf(db: DbOrTx, siteId: string): Promise<DuePolicy | null> {
  const [row] = await db
    .select({ policy: siteDuePolicies.policy })
    .from(siteDuePolicies)
    .where(eq(siteDuePolicies.siteId, siteId));
  return row?.policy ?? null;
}

export async function saveDuePolicy(db: DbOrTx, siteId: string, policy: DuePolicy) {
  await db
    .insert(siteDuePolicies)
    .values({ siteId, policy })
    .onConflictDoUpdate({
      target: siteDuePolicies.siteId,
      set: { policy, updatedAt: new Date() },
    });
}

export interface Recipient {
  id: string;
  name: string;
  email: string;
}

/** Active people holding `role` at the site itself, earliest grant first. */
export async function peopleWithRoleAt(
  db: DbOrTx,
  siteId: string,
  role: "facilities_lead" | "auditor",
): Promise<Recipient[]> {
  return db
    .select({ id: users.id, name: users.displayName, email: users.email })
    .from(roleGrants)
    .innerJoin(users, eq(users.id, roleGrants.userId))
    .where(
      and(eq(roleGrants.siteId, siteId), eq(roleGrants.role, role), isNull(users.deactivatedAt)),
    )
    .orderBy(asc(roleGrants.createdAt), asc(users.displayName));
}

export async function findPerson(db: DbOrTx, userId: string): Promise<Recipient | null> {
  const [row] = await db
    .select({ id: users.id, name: users.displayName, email: users.email })
    .from(users)
    .where(and(eq(users.id, userId), isNull(users.deactivatedAt)));
  return row ?? null;
}

/** A newer unfinished action on the same item and space (reopening would make a twin). */
export async function newerUnfinishedTwin(
  db: DbOrTx,
  action: { id: string; spaceId: string; itemKey: string },
) {
  const [row] = await db
    .select({ id: correctiveActions.id })
    .from(correctiveActions)
    .where(
      and(
        eq(correctiveActions.spaceId, action.spaceId),
        eq(correctiveActions.itemKey, action.itemKey),
        ne(correctiveActions.state, "done"),
        ne(correctiveActions.id, action.id),
      ),
    );
  return row ?? null;
}

/** Actions a time-based notice may be due for: unfinished, owned, within a day of due or past. */
export async function noticeCandidates(db: DbOrTx, now: Date) {
  const rows = await actionQuery(db).where(
    and(
      inArray(correctiveActions.state, [...ownerWorkStates]),
      sql`${correctiveActions.assigneeId} is not null`,
      sql`${correctiveActions.dueAt} <= ${new Date(now.getTime() + 24 * 60 * 60 * 1000)}`,
    ),
  );
  if (rows.length === 0) return [];
  const overdueNotices = await db
    .select({ actionId: actionNotices.actionId, createdAt: actionNotices.createdAt })
    .from(actionNotices)
    .where(
      and(
        eq(actionNotices.kind, "overdue"),
        inArray(
          actionNotices.actionId,
          rows.map((row) => row.id),
        ),
      ),
    );
  const noticed = new Map(overdueNotices.map((notice) => [notice.actionId, notice.createdAt]));
  return rows.map((row) => ({ ...row, overdueNoticeAt: noticed.get(row.id) ?? null }));
}

/** Records a notice; false when it was already recorded (by this process or another). */
export async function claimNotice(
  db: DbOrTx,
  actionId: string,
  kind: string,
  at: Date,
): Promise<boolean> {
  const rows = await db
    .insert(actionNotices)
    .values({ actionId, kind, createdAt: at })
    .onConflictDoNothing()
    .returning({ id: actionNotices.id });
  return rows.length > 0;
}

/** The unfinished actions of the spaces, locked for closing. */
export async function lockUnfinishedActionsOf(db: DbOrTx, spaceIds: readonly string[]) {
  if (spaceIds.length === 0) return [];
  return db
    .select()
    .from(correctiveActions)
    .where(and(inArray(correctiveActions.spaceId, spaceIds), ne(correctiveActions.state, "done")))
    .orderBy(asc(correctiveActions.id))
    .for("update");
}

/** Actions of the spaces closed because a space was retired at or after `since`, locked. */
export async function lockActionsClosedByRetirement(
  db: DbOrTx,
  spaceIds: readonly string[],
  since: Date,
) {
  if (spaceIds.length === 0) return [];
  return db
    .select()
    .from(correctiveActions)
    .where(
      and(
        inArray(correctiveActions.spaceId, spaceIds),
        eq(correctiveActions.state, "done"),
        eq(correctiveActions.closeReason, "space_retired"),
        sql`${correctiveActions.closedAt} >= ${since}`,
      ),
    )
    .orderBy(asc(correctiveActions.id))
    .for("update");
}

/**
 * The state an action had when its space's retirement closed it (the latest such move), read
 * through the translation of earlier change-log codes.
 */
export async function stateBeforeRetirement(db: DbOrTx, actionId: string) {
  const [row] = await db
    .select({ before: changeLog.before })
    .from(changeLog)
    .where(
      and(
        eq(changeLog.entity, "corrective_action"),
        eq(changeLog.entityId, actionId),
        eq(changeLog.action, "action.space_retired"),
      ),
    )
    .orderBy(desc(changeLog.occurredAt))
    .limit(1);
  return stateOfLogEntry(row?.before);
}

/** Whether any action or finding follows the spaces (history that must not be deleted). */
export async function countActionsOfSpaces(db: DbOrTx, spaceIds: readonly string[]) {
  if (spaceIds.length === 0) return 0;
  const [row] = await db
    .select({ n: count() })
    .from(correctiveActions)
    .where(inArray(correctiveActions.spaceId, spaceIds));
  return row?.n ?? 0;
}
