import { and, asc, desc, eq, inArray, isNotNull, sql, type SQL } from "drizzle-orm";

import { defaultRetentionDays } from "@shared/schemas/observations";

import { readTogether, type DbOrTx } from "../../db/client";
import {
  observationBreaches,
  observationSettings,
  observations,
  observationSteps,
  sequenceVersions,
  spaces,
} from "../../db/schema/index";

export type ObservationRow = typeof observations.$inferSelect;

/** Serialises the first recording of an observation id, so a retry racing the first stores once. */
export async function lockObservationId(db: DbOrTx, observationId: string): Promise<void> {
  await db.execute(sql`select pg_advisory_xact_lock(hashtext(${`observation:${observationId}`}))`);
}

export async function findObservation(
  db: DbOrTx,
  observationId: string,
): Promise<ObservationRow | null> {
  const [row] = await db.select().from(observations).where(eq(observations.id, observationId));
  return row ?? null;
}

export async function siteOfObservation(db: DbOrTx, observationId: string) {
  const [row] = await db
    .select({ siteId: observations.siteId })
    .from(observations)
    .where(eq(observations.id, observationId));
  return row?.siteId ?? null;
}

export async function findSpace(db: DbOrTx, spaceId: string) {
  const [row] = await db
    .select({
      id: spaces.id,
      siteId: spaces.siteId,
      zoneType: spaces.zoneType,
      name: spaces.name,
      retiredAt: spaces.retiredAt,
    })
    .from(spaces)
    .where(eq(spaces.id, spaceId));
  return row ?? null;
}

export async function insertObservation(db: DbOrTx, values: typeof observations.$inferInsert) {
  await db.insert(observations).values(values);
}

/** The area check as stored, once the failed checks know the actions they opened or joined. */
export async function setPrecheck(
  db: DbOrTx,
  observationId: string,
  precheck: NonNullable<(typeof observations.$inferInsert)["precheck"]>,
) {
  await db.update(observations).set({ precheck }).where(eq(observations.id, observationId));
}

export async function insertSteps(db: DbOrTx, rows: (typeof observationSteps.$inferInsert)[]) {
  if (rows.length > 0) await db.insert(observationSteps).values(rows);
}

export async function insertBreaches(
  db: DbOrTx,
  rows: (typeof observationBreaches.$inferInsert)[],
) {
  if (rows.length > 0) await db.insert(observationBreaches).values(rows);
}

/** Observations with what the reply needs, in the order asked. */
export async function observationRows(db: DbOrTx, where: SQL | undefined, limit?: number) {
  const query = db
    .select({
      observation: observations,
      spaceName: spaces.name,
      zoneType: spaces.zoneType,
      sequenceTitle: sequenceVersions.title,
      sequenceKind: sequenceVersions.kind,
    })
    .from(observations)
    .innerJoin(spaces, eq(spaces.id, observations.spaceId))
    .innerJoin(sequenceVersions, eq(sequenceVersions.id, observations.sequenceVersionId))
    .where(where)
    .orderBy(desc(observations.finishedAt), desc(observations.id));
  const rows = limit ? await query.limit(limit) : await query;
  if (rows.length === 0) return [];
  const ids = rows.map((row) => row.observation.id);
  const [breachedSteps, findings] = await readTogether(db, [
    () =>
      db
        .select({
          observationId: observationSteps.observationId,
          position: observationSteps.position,
        })
        .from(observationSteps)
        .where(
          and(inArray(observationSteps.observationId, ids), eq(observationSteps.breached, true)),
        )
        .orderBy(asc(observationSteps.position)),
    () =>
      db
        .selectDistinct({
          observationId: observationBreaches.observationId,
          spaceProblem: observationBreaches.spaceProblem,
          actionId: observationBreaches.actionId,
        })
        .from(observationBreaches)
        .where(
          and(
            inArray(observationBreaches.observationId, ids),
            isNotNull(observationBreaches.actionId),
          ),
        ),
  ]);
  return rows.map((row) => ({
    ...row,
    breachedSteps: breachedSteps
      .filter((step) => step.observationId === row.observation.id)
      .map((step) => step.position),
    findings: findings.filter((finding) => finding.observationId === row.observation.id),
  }));
}

export const byId = (observationId: string) => eq(observations.id, observationId);
export const bySpace = (spaceId: string) => eq(observations.spaceId, spaceId);

export async function retentionDaysOf(db: DbOrTx, networkId: string): Promise<number> {
  const [row] = await db
    .select({ retentionDays: observationSettings.retentionDays })
    .from(observationSettings)
    .where(eq(observationSettings.networkId, networkId));
  return row?.retentionDays ?? defaultRetentionDays;
}

export async function saveRetentionDays(db: DbOrTx, networkId: string, retentionDays: number) {
  await db
    .insert(observationSettings)
    .values({ networkId, retentionDays })
    .onConflictDoUpdate({
      target: observationSettings.networkId,
      set: { retentionDays, updatedAt: new Date() },
    });
}

/**
 * Removes the detail of every observation finished longer ago than its network keeps it: the
 * staff code, the coaching note, the pre-check and the breaches (with their notes). The outcome,
 * the counts and which steps were breached stay. Rows another purge is working on are skipped.
 */
export async function purgeDetail(db: DbOrTx, now: Date): Promise<string[]> {
  const result = await db.execute<{ id: string }>(sql`
    with due as (
      select o.id
      from observations o
      join sites s on s.id = o.site_id
      left join observation_settings st on st.network_id = s.network_id
      where o.detail_removed_at is null
        and o.finished_at < ${now.toISOString()}::timestamptz
          - make_interval(days => coalesce(st.retention_days, ${defaultRetentionDays}))
      for update of o skip locked
    ), gone as (
      delete from observation_breaches b using due where b.observation_id = due.id
    )
    update observations o
    set staff_code = null, coaching_note = null, precheck = null,
        detail_removed_at = ${now.toISOString()}::timestamptz
    from due
    where o.id = due.id
    returning o.id`);
  return result.rows.map((row) => row.id);
}
