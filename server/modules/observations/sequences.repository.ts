import { and, asc, desc, eq, inArray, max } from "drizzle-orm";

import type { SequenceStep, SequenceVersion } from "@shared/schemas/observations";

import type { DbOrTx } from "../../db/client";
import { sequenceSteps, sequenceVersions } from "../../db/schema/index";

export type VersionRow = typeof sequenceVersions.$inferSelect;
type StepRow = typeof sequenceSteps.$inferSelect;

export function toStep(row: StepRow): SequenceStep {
  return {
    id: row.id,
    key: row.key,
    position: row.position,
    text: row.text,
    handHygiene: row.handHygiene,
    watchFor: row.watchFor as SequenceStep["watchFor"],
    reference: row.reference,
  };
}

export function toVersion(row: VersionRow, steps: readonly StepRow[]): SequenceVersion {
  return {
    id: row.id,
    key: row.key,
    kind: row.kind,
    version: row.version,
    status: row.status,
    title: row.title,
    note: row.note,
    publishedAt: row.publishedAt?.toISOString() ?? null,
    steps: steps.filter((step) => step.versionId === row.id).map(toStep),
  };
}

/** The newest published version and the draft (if any) of every sequence in the network. */
export async function currentVersions(db: DbOrTx, networkId: string): Promise<SequenceVersion[]> {
  const rows = await db
    .select()
    .from(sequenceVersions)
    .where(eq(sequenceVersions.networkId, networkId))
    .orderBy(
      asc(sequenceVersions.createdAt),
      asc(sequenceVersions.key),
      desc(sequenceVersions.version),
    );
  // Rows come oldest first, so each sequence keeps the place of its first version; the newest
  // published version is the one with the highest number, whenever it was made.
  const newestPublished = new Map<string, VersionRow>();
  const drafts = new Map<string, VersionRow>();
  for (const row of rows) {
    if (row.status === "draft") drafts.set(row.key, row);
    else if ((newestPublished.get(row.key)?.version ?? -1) < row.version)
      newestPublished.set(row.key, row);
  }
  const wanted: VersionRow[] = [...new Set(rows.map((row) => row.key))].flatMap((key) =>
    [newestPublished.get(key), drafts.get(key)].filter((row) => row !== undefined),
  );
  if (wanted.length === 0) return [];
  const steps = await db
    .select()
    .from(sequenceSteps)
    .where(
      inArray(
        sequenceSteps.versionId,
        wanted.map((row) => row.id),
      ),
    )
    .orderBy(asc(sequenceSteps.position));
  return wanted.map((row) => toVersion(row, steps));
}

export async function keysOf(db: DbOrTx, networkId: string): Promise<Set<string>> {
  const rows = await db
    .selectDistinct({ key: sequenceVersions.key })
    .from(sequenceVersions)
    .where(eq(sequenceVersions.networkId, networkId));
  return new Set(rows.map((row) => row.key));
}

export async function latestPublished(
  db: DbOrTx,
  networkId: string,
  key: string,
): Promise<VersionRow | null> {
  const [row] = await db
    .select()
    .from(sequenceVersions)
    .where(
      and(
        eq(sequenceVersions.networkId, networkId),
        eq(sequenceVersions.key, key),
        eq(sequenceVersions.status, "published"),
      ),
    )
    .orderBy(desc(sequenceVersions.version))
    .limit(1);
  return row ?? null;
}

export async function findDraft(
  db: DbOrTx,
  networkId: string,
  key: string,
): Promise<VersionRow | null> {
  const [row] = await db
    .select()
    .from(sequenceVersions)
    .where(
      and(
        eq(sequenceVersions.networkId, networkId),
        eq(sequenceVersions.key, key),
        eq(sequenceVersions.status, "draft"),
      ),
    )
    .for("update");
  return row ?? null;
}

export async function nextVersionNumber(
  db: DbOrTx,
  networkId: string,
  key: string,
): Promise<number> {
  const [row] = await db
    .select({ highest: max(sequenceVersions.version) })
    .from(sequenceVersions)
    .where(and(eq(sequenceVersions.networkId, networkId), eq(sequenceVersions.key, key)));
  return (row?.highest ?? 0) + 1;
}

export async function insertVersion(
  db: DbOrTx,
  values: typeof sequenceVersions.$inferInsert,
): Promise<VersionRow> {
  const [row] = await db.insert(sequenceVersions).values(values).returning();
  return row!;
}

export async function updateVersion(
  db: DbOrTx,
  versionId: string,
  values: Partial<typeof sequenceVersions.$inferInsert>,
): Promise<void> {
  await db.update(sequenceVersions).set(values).where(eq(sequenceVersions.id, versionId));
}

export async function deleteVersion(db: DbOrTx, versionId: string): Promise<void> {
  await db.delete(sequenceVersions).where(eq(sequenceVersions.id, versionId));
}

export async function replaceSteps(
  db: DbOrTx,
  versionId: string,
  steps: Omit<typeof sequenceSteps.$inferInsert, "versionId">[],
): Promise<void> {
  await db.delete(sequenceSteps).where(eq(sequenceSteps.versionId, versionId));
  if (steps.length > 0)
    await db.insert(sequenceSteps).values(steps.map((step) => ({ ...step, versionId })));
}

export async function findVersion(db: DbOrTx, versionId: string): Promise<VersionRow | null> {
  const [row] = await db.select().from(sequenceVersions).where(eq(sequenceVersions.id, versionId));
  return row ?? null;
}

export async function stepsOfVersion(db: DbOrTx, versionId: string): Promise<SequenceStep[]> {
  const rows = await db
    .select()
    .from(sequenceSteps)
    .where(eq(sequenceSteps.versionId, versionId))
    .orderBy(asc(sequenceSteps.position));
  return rows.map(toStep);
}
