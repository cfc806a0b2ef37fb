import { and, asc, desc, eq, inArray, max } from "drizzle-orm";

import type { ChecklistItem, ChecklistVersion } from "@shared/schemas/checklists";
import type { ZoneType } from "@shared/zones";

import type { DbOrTx } from "../../db/client";
import { checklistItems, checklistVersions } from "../../db/schema/index";

type ItemRow = typeof checklistItems.$inferSelect;
type VersionRow = typeof checklistVersions.$inferSelect;

export function toItem(row: ItemRow): ChecklistItem {
  return {
    id: row.id,
    key: row.key,
    position: row.position,
    text: row.text,
    severity: row.severity,
    response: row.response,
    quantity: (row.quantity as ChecklistItem["quantity"]) ?? null,
    threshold:
      row.thresholdOp && row.thresholdValue !== null
        ? { op: row.thresholdOp as ">=" | "<=", value: row.thresholdValue }
        : null,
    choices: row.choices ?? null,
    reference: row.reference,
    photoOnFail: row.photoOnFail,
  };
}

function toVersion(row: VersionRow, items: ItemRow[]): ChecklistVersion {
  return {
    id: row.id,
    zoneType: row.zoneType,
    version: row.version,
    status: row.status,
    title: row.title,
    publishedAt: row.publishedAt?.toISOString() ?? null,
    items: items.filter((item) => item.versionId === row.id).map(toItem),
  };
}

/** The newest published version and the draft (if any) of every zone type in the network. */
export async function currentVersions(db: DbOrTx, networkId: string): Promise<ChecklistVersion[]> {
  const rows = await db
    .select()
    .from(checklistVersions)
    .where(eq(checklistVersions.networkId, networkId))
    .orderBy(asc(checklistVersions.zoneType), desc(checklistVersions.version));
  const wanted: VersionRow[] = [];
  const seenPublished = new Set<string>();
  for (const row of rows) {
    if (row.status === "draft") wanted.push(row);
    else if (!seenPublished.has(row.zoneType)) {
      seenPublished.add(row.zoneType);
      wanted.push(row);
    }
  }
  if (wanted.length === 0) return [];
  const items = await db
    .select()
    .from(checklistItems)
    .where(
      inArray(
        checklistItems.versionId,
        wanted.map((row) => row.id),
      ),
    )
    .orderBy(asc(checklistItems.position));
  return wanted.map((row) => toVersion(row, items));
}

export async function latestPublished(
  db: DbOrTx,
  networkId: string,
  zoneType: ZoneType,
): Promise<VersionRow | null> {
  const [row] = await db
    .select()
    .from(checklistVersions)
    .where(
      and(
        eq(checklistVersions.networkId, networkId),
        eq(checklistVersions.zoneType, zoneType),
        eq(checklistVersions.status, "published"),
      ),
    )
    .orderBy(desc(checklistVersions.version))
    .limit(1);
  return row ?? null;
}

export async function findDraft(
  db: DbOrTx,
  networkId: string,
  zoneType: ZoneType,
): Promise<VersionRow | null> {
  const [row] = await db
    .select()
    .from(checklistVersions)
    .where(
      and(
        eq(checklistVersions.networkId, networkId),
        eq(checklistVersions.zoneType, zoneType),
        eq(checklistVersions.status, "draft"),
      ),
    )
    .for("update");
  return row ?? null;
}

export async function nextVersionNumber(
  db: DbOrTx,
  networkId: string,
  zoneType: ZoneType,
): Promise<number> {
  const [row] = await db
    .select({ highest: max(checklistVersions.version) })
    .from(checklistVersions)
    .where(
      and(eq(checklistVersions.networkId, networkId), eq(checklistVersions.zoneType, zoneType)),
    );
  return (row?.highest ?? 0) + 1;
}

export async function insertVersion(
  db: DbOrTx,
  values: typeof checklistVersions.$inferInsert,
): Promise<VersionRow> {
  const [row] = await db.insert(checklistVersions).values(values).returning();
  return row!;
}

export async function replaceItems(
  db: DbOrTx,
  versionId: string,
  items: Omit<typeof checklistItems.$inferInsert, "versionId">[],
): Promise<void> {
  await db.delete(checklistItems).where(eq(checklistItems.versionId, versionId));
  if (items.length > 0)
    await db.insert(checklistItems).values(items.map((item) => ({ ...item, versionId })));
}

export async function updateVersion(
  db: DbOrTx,
  versionId: string,
  values: Partial<typeof checklistVersions.$inferInsert>,
): Promise<void> {
  await db.update(checklistVersions).set(values).where(eq(checklistVersions.id, versionId));
}

export async function deleteVersion(db: DbOrTx, versionId: string): Promise<void> {
  await db.delete(checklistVersions).where(eq(checklistVersions.id, versionId));
}

export async function itemsOfVersion(db: DbOrTx, versionId: string): Promise<ChecklistItem[]> {
  const rows = await db
    .select()
    .from(checklistItems)
    .where(eq(checklistItems.versionId, versionId))
    .orderBy(asc(checklistItems.position));
  return rows.map(toItem);
}

export async function findVersion(db: DbOrTx, versionId: string): Promise<VersionRow | null> {
  const [row] = await db
    .select()
    .from(checklistVersions)
    .where(eq(checklistVersions.id, versionId));
  return row ?? null;
}
