import { and, asc, count, desc, eq, inArray, isNotNull, isNull, or, sql } from "drizzle-orm";

import type { Answer, Audit } from "@shared/schemas/audits";

import { readTogether, type DbOrTx } from "../../db/client";
import {
  actionProofs,
  auditAnswers,
  auditPhotos,
  audits,
  checklistVersions,
  floors,
  images,
  spaceCadences,
  spaces,
  users,
} from "../../db/schema/index";

const auditColumns = {
  id: audits.id,
  siteId: audits.siteId,
  spaceId: audits.spaceId,
  spaceName: spaces.name,
  zoneType: spaces.zoneType,
  spaceRetiredAt: spaces.retiredAt,
  checklistVersionId: audits.checklistVersionId,
  checklistVersion: checklistVersions.version,
  auditorId: audits.auditorId,
  auditorName: users.displayName,
  status: audits.status,
  startedAt: audits.startedAt,
  submittedAt: audits.submittedAt,
  verdict: audits.verdict,
  score: audits.score,
  rulesVersion: audits.rulesVersion,
  verdictReasons: audits.verdictReasons,
};

type AuditRow = { startedAt: Date; submittedAt: Date | null; spaceRetiredAt: Date | null } & Omit<
  Audit,
  "startedAt" | "submittedAt" | "spaceRetiredAt"
>;
const toAudit = (row: AuditRow): Audit => ({
  ...row,
  startedAt: row.startedAt.toISOString(),
  submittedAt: row.submittedAt?.toISOString() ?? null,
  spaceRetiredAt: row.spaceRetiredAt?.toISOString() ?? null,
});

function auditQuery(db: DbOrTx) {
  return db
    .select(auditColumns)
    .from(audits)
    .innerJoin(spaces, eq(spaces.id, audits.spaceId))
    .innerJoin(checklistVersions, eq(checklistVersions.id, audits.checklistVersionId))
    .innerJoin(users, eq(users.id, audits.auditorId));
}

export async function findAudit(db: DbOrTx, auditId: string): Promise<Audit | null> {
  const [row] = await auditQuery(db).where(eq(audits.id, auditId));
  return row ? toAudit(row) : null;
}

/** The audit, holding its row lock until the transaction ends (the joined rows stay unlocked). */
export async function lockAudit(db: DbOrTx, auditId: string): Promise<Audit | null> {
  const [row] = await auditQuery(db).where(eq(audits.id, auditId)).for("update", { of: audits });
  return row ? toAudit(row) : null;
}

export async function insertAudit(
  db: DbOrTx,
  values: typeof audits.$inferInsert,
): Promise<boolean> {
  const rows = await db
    .insert(audits)
    .values(values)
    .onConflictDoNothing()
    .returning({ id: audits.id });
  return rows.length > 0;
}

export async function markSubmitted(
  db: DbOrTx,
  auditId: string,
  values: {
    verdict: Audit["verdict"];
    score: number | null;
    submittedAt: Date;
    rulesVersion: number;
    verdictReasons: string[];
  },
) {
  await db
    .update(audits)
    .set({ status: "submitted", ...values })
    .where(eq(audits.id, auditId));
}

/** Submitted audits of the space, and the caller's own drafts, newest first. */
export async function auditsOfSpace(db: DbOrTx, spaceId: string, userId: string): Promise<Audit[]> {
  const rows = await auditQuery(db)
    .where(
      and(
        eq(audits.spaceId, spaceId),
        or(eq(audits.status, "submitted"), eq(audits.auditorId, userId)),
      ),
    )
    .orderBy(desc(sql`coalesce(${audits.submittedAt}, ${audits.startedAt})`));
  return rows.map(toAudit);
}

const answerColumns = {
  id: auditAnswers.id,
  itemId: auditAnswers.itemId,
  outcome: auditAnswers.outcome,
  value: auditAnswers.value,
  unit: auditAnswers.unit,
  enteredValue: auditAnswers.enteredValue,
  count: auditAnswers.count,
  choice: auditAnswers.choice,
  note: auditAnswers.note,
};

export async function answersOf(db: DbOrTx, auditId: string): Promise<Answer[]> {
  const rows = await db
    .select(answerColumns)
    .from(auditAnswers)
    .where(eq(auditAnswers.auditId, auditId));
  return rows.map((row) => ({ ...row, unit: row.unit as Answer["unit"] }));
}

export async function findAnswer(db: DbOrTx, auditId: string, itemId: string) {
  const [row] = await db
    .select(answerColumns)
    .from(auditAnswers)
    .where(and(eq(auditAnswers.auditId, auditId), eq(auditAnswers.itemId, itemId)));
  return row ? { ...row, unit: row.unit as Answer["unit"] } : null;
}

/** Where an answer id is already used, if anywhere. */
export async function findAnswerOwner(db: DbOrTx, answerId: string) {
  const [row] = await db
    .select({ auditId: auditAnswers.auditId, itemId: auditAnswers.itemId })
    .from(auditAnswers)
    .where(eq(auditAnswers.id, answerId));
  return row ?? null;
}

/** One answer per item: a repeat (same device id, or the same item again) updates it in place. */
export async function upsertAnswer(
  db: DbOrTx,
  values: typeof auditAnswers.$inferInsert,
): Promise<Answer> {
  const { id: _id, auditId: _auditId, itemId: _itemId, ...changes } = values;
  const [row] = await db
    .insert(auditAnswers)
    .values(values)
    .onConflictDoUpdate({
      target: [auditAnswers.auditId, auditAnswers.itemId],
      set: { ...changes, updatedAt: new Date() },
    })
    .returning(answerColumns);
  return { ...row!, unit: row!.unit as Answer["unit"] };
}

export async function photosOf(db: DbOrTx, auditId: string) {
  return db
    .select({ id: auditPhotos.id, itemId: auditPhotos.itemId, imageId: auditPhotos.imageId })
    .from(auditPhotos)
    .where(eq(auditPhotos.auditId, auditId))
    .orderBy(asc(auditPhotos.createdAt));
}

/** A stored photo with the SHA-256 of the bytes it was uploaded as. */
export async function findPhoto(db: DbOrTx, photoId: string) {
  const [row] = await db
    .select({
      id: auditPhotos.id,
      auditId: auditPhotos.auditId,
      itemId: auditPhotos.itemId,
      imageId: auditPhotos.imageId,
      sha256: images.sha256,
    })
    .from(auditPhotos)
    .innerJoin(images, eq(images.id, auditPhotos.imageId))
    .where(eq(auditPhotos.id, photoId));
  return row ?? null;
}

/** The audits whose photos show the image, and whether anything else (a plan, a proof) does. */
export async function usesOfImage(db: DbOrTx, imageId: string) {
  const [inAudits, inProofs, inPlans] = await readTogether(db, [
    () =>
      db
        .select({ status: audits.status, auditorId: audits.auditorId })
        .from(auditPhotos)
        .innerJoin(audits, eq(audits.id, auditPhotos.auditId))
        .where(eq(auditPhotos.imageId, imageId)),
    () =>
      db
        .select({ id: actionProofs.id })
        .from(actionProofs)
        .where(eq(actionProofs.imageId, imageId))
        .limit(1),
    () => db.select({ id: floors.id }).from(floors).where(eq(floors.planImageId, imageId)).limit(1),
  ]);
  return { audits: inAudits, elsewhere: inProofs.length > 0 || inPlans.length > 0 };
}

export async function insertPhoto(db: DbOrTx, values: typeof auditPhotos.$inferInsert) {
  const [row] = await db
    .insert(auditPhotos)
    .values(values)
    .onConflictDoNothing()
    .returning({ id: auditPhotos.id, itemId: auditPhotos.itemId, imageId: auditPhotos.imageId });
  return row ?? null;
}

export async function findSpaceForAudit(db: DbOrTx, spaceId: string) {
  const [row] = await db
    .select({
      id: spaces.id,
      siteId: spaces.siteId,
      zoneType: spaces.zoneType,
      name: spaces.name,
      volumeM3: spaces.volumeM3,
      constructionClass: spaces.constructionClass,
      retiredAt: spaces.retiredAt,
    })
    .from(spaces)
    .where(eq(spaces.id, spaceId));
  return row ?? null;
}

export async function scheduleRows(db: DbOrTx, siteId: string) {
  const latest = db
    .selectDistinctOn([audits.spaceId], {
      spaceId: audits.spaceId,
      submittedAt: audits.submittedAt,
      verdict: audits.verdict,
      auditorName: users.displayName,
    })
    .from(audits)
    .innerJoin(users, eq(users.id, audits.auditorId))
    .where(and(eq(audits.siteId, siteId), isNotNull(audits.submittedAt)))
    .orderBy(audits.spaceId, desc(audits.submittedAt))
    .as("latest");
  return db
    .select({
      spaceId: spaces.id,
      spaceName: spaces.name,
      zoneType: spaces.zoneType,
      floorId: floors.id,
      floorName: floors.name,
      createdAt: spaces.createdAt,
      cadenceDays: spaceCadences.cadenceDays,
      lastAuditAt: latest.submittedAt,
      verdict: latest.verdict,
      lastAuditorName: latest.auditorName,
    })
    .from(spaces)
    .innerJoin(floors, eq(floors.id, spaces.floorId))
    .leftJoin(spaceCadences, eq(spaceCadences.spaceId, spaces.id))
    .leftJoin(latest, eq(latest.spaceId, spaces.id))
    .where(and(eq(spaces.siteId, siteId), isNull(spaces.retiredAt)));
}

export async function setCadence(db: DbOrTx, spaceId: string, cadenceDays: number) {
  await db
    .insert(spaceCadences)
    .values({ spaceId, cadenceDays })
    .onConflictDoUpdate({
      target: spaceCadences.spaceId,
      set: { cadenceDays, updatedAt: new Date() },
    });
}

export async function setAnswerOutcome(
  db: DbOrTx,
  auditId: string,
  itemId: string,
  outcome: Answer["outcome"],
  note: string | null | undefined,
) {
  await db
    .update(auditAnswers)
    .set({ outcome, ...(note !== undefined ? { note } : {}), updatedAt: new Date() })
    .where(and(eq(auditAnswers.auditId, auditId), eq(auditAnswers.itemId, itemId)));
}

export async function setVerdict(
  db: DbOrTx,
  auditId: string,
  values: {
    verdict: Audit["verdict"];
    score: number | null;
    rulesVersion: number;
    verdictReasons: string[];
  },
) {
  await db.update(audits).set(values).where(eq(audits.id, auditId));
}

/** How many audits, drafts included, the spaces have: any at all is history. */
export async function countAuditsOfSpaces(db: DbOrTx, spaceIds: readonly string[]) {
  if (spaceIds.length === 0) return 0;
  const [row] = await db
    .select({ n: count() })
    .from(audits)
    .where(inArray(audits.spaceId, spaceIds));
  return row?.n ?? 0;
}
